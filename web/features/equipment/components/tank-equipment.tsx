import { ErrorState, LoadingState } from '../../../components/states';
import { todayIn } from '../../../lib/format';
import { useEquipment } from '../../../lib/queries/equipment';
import { EquipmentList } from './equipment-list';
import { PowerBoardMap } from './power-board-map';

/** The equipment section of a tank's page: the power boards, then each item and its maintenance. */
export function TankEquipment({ tankId, timeZone }: { tankId: string; timeZone: string }) {
  const equipment = useEquipment(tankId);
  if (equipment.isPending) return <LoadingState label="Loading equipment…" />;
  if (equipment.isError) {
    return (
      <ErrorState error={equipment.error} what="the equipment" onRetry={() => void equipment.refetch()} />
    );
  }
  return (
    <div className="space-y-6">
      <PowerBoardMap equipment={equipment.data} />
      <div>
        <h3 className="mb-2 text-lg font-bold text-ink-900">Equipment and maintenance</h3>
        <EquipmentList equipment={equipment.data} today={todayIn(timeZone)} />
      </div>
    </div>
  );
}

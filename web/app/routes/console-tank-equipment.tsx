import { Link, useParams } from 'react-router';
import { Page } from '../../components/page';
import { ErrorState, LoadingState } from '../../components/states';
import { useEquipment } from '../../lib/queries/equipment';
import { EquipmentEditor } from '../../features/equipment/components/equipment-editor';
import { PowerBoardMap } from '../../features/equipment/components/power-board-map';
import { useTank } from '../../features/tanks/api/get-tank';

export function ConsoleTankEquipmentRoute() {
  const { tankId = '' } = useParams();
  const tank = useTank(tankId);
  const equipment = useEquipment(tankId);

  if (tank.isPending) {
    return (
      <Page title="Equipment">
        <LoadingState label="Loading the tank…" />
      </Page>
    );
  }
  if (tank.isError) {
    return (
      <Page title="Equipment">
        <ErrorState error={tank.error} what="this tank" onRetry={() => void tank.refetch()} />
      </Page>
    );
  }
  return (
    <Page
      title={`Equipment in ${tank.data.name}`}
      description={
        <Link to={`/tanks/${tankId}`} className="font-bold text-brine-700">
          Back to the tank page
        </Link>
      }
    >
      {equipment.isPending ? (
        <LoadingState label="Loading equipment…" />
      ) : equipment.isError ? (
        <ErrorState error={equipment.error} what="the equipment" onRetry={() => void equipment.refetch()} />
      ) : (
        <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
          <EquipmentEditor tankId={tankId} equipment={equipment.data} />
          <section aria-labelledby="map-title">
            <h2 id="map-title" className="mb-3 text-xl font-bold text-ink-900">
              Power-board map the owners see
            </h2>
            <PowerBoardMap equipment={equipment.data} />
          </section>
        </div>
      )}
    </Page>
  );
}

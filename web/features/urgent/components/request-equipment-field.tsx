import { useWatch } from 'react-hook-form';
import { Link } from 'react-router';
import { compareOutlets, equipmentKindLabels, type EquipmentItem } from '@shared/schemas/equipment';
import { SelectField } from '../../../components/form-fields';
import { ErrorState, LoadingState } from '../../../components/states';
import { useEquipment } from '../../../lib/queries/equipment';
import type { RequestFormValues } from '../utils/request-form';

/** "board B, outlet 4", or null when the technician has not recorded where it is plugged in. */
export function outletOf(item: Pick<EquipmentItem, 'powerBoard' | 'outlet'>): string | null {
  if (item.powerBoard && item.outlet) return `outlet ${item.outlet} on board ${item.powerBoard}`;
  if (item.powerBoard) return `board ${item.powerBoard}`;
  if (item.outlet) return `outlet ${item.outlet}`;
  return null;
}

/**
 * Which item stopped, from the tank's own equipment, with where it is plugged in: the first-aid
 * steps say to find its outlet, so the map is one tap away.
 */
export function RequestEquipmentField({
  tankId,
  powerBoardHref,
}: {
  tankId: string;
  powerBoardHref: string;
}) {
  const equipment = useEquipment(tankId);
  const chosenId = useWatch<RequestFormValues, 'equipmentId'>({ name: 'equipmentId' });
  if (equipment.isPending) return <LoadingState label="Loading the tank’s equipment…" />;
  if (equipment.isError)
    return (
      <ErrorState
        error={equipment.error}
        what="the tank’s equipment"
        onRetry={() => void equipment.refetch()}
      />
    );
  const items = equipment.data
    .filter((item) => item.kind !== 'power-board')
    .sort(
      (a, b) =>
        compareOutlets(a.powerBoard, b.powerBoard) ||
        compareOutlets(a.outlet, b.outlet) ||
        a.description.localeCompare(b.description),
    );
  const chosen = items.find((item) => item.id === chosenId) ?? null;
  const outlet = chosen ? outletOf(chosen) : null;
  return (
    <div className="grid gap-2">
      {items.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-300 p-3 text-sm text-ink-700">
          No equipment is recorded for this tank yet. Say which item stopped in the description.
        </p>
      ) : (
        <SelectField<RequestFormValues>
          name="equipmentId"
          label="Which item stopped?"
          options={[
            { value: '', label: 'Not sure, or not listed' },
            ...items.map((item) => {
              const where = outletOf(item);
              return {
                value: item.id,
                label: `${item.description} (${equipmentKindLabels[item.kind]})${where ? ` — ${where}` : ''}`,
              };
            }),
          ]}
        />
      )}
      {chosen && (
        <p className="rounded-lg bg-ink-50 p-3 text-ink-950" aria-live="polite">
          {outlet ? (
            <>
              <span className="font-bold">{chosen.description}</span> is plugged into{' '}
              <span className="font-bold">{outlet}</span>.
            </>
          ) : (
            <>Where {chosen.description} is plugged in is not recorded yet.</>
          )}
        </p>
      )}
      <p>
        <Link to={powerBoardHref} className="inline-flex min-h-11 items-center font-bold text-brine-700">
          See the power board map: what each outlet feeds
        </Link>
      </p>
    </div>
  );
}

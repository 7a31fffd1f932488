import { equipmentKindLabels, type EquipmentItem } from '@shared/schemas/equipment';
import { formatDay } from '../../../lib/format';

export function isOverdue(item: EquipmentItem, today: string): boolean {
  return item.maintenanceDueOn !== null && item.maintenanceDueOn < today;
}

/** What is installed and when each piece is next due for maintenance. */
export function EquipmentList({ equipment, today }: { equipment: readonly EquipmentItem[]; today: string }) {
  const items = equipment.filter((item) => item.kind !== 'power-board');
  if (items.length === 0) {
    return (
      <p className="rounded-card border border-dashed border-ink-300 bg-white p-5 text-sm text-ink-700">
        No equipment recorded yet.
      </p>
    );
  }
  return (
    <ul className="divide-y divide-ink-100 rounded-card bg-white shadow-card">
      {items.map((item) => {
        const overdue = isOverdue(item, today);
        return (
          <li key={item.id} className="flex flex-wrap items-start justify-between gap-x-4 gap-y-1 p-4">
            <div className="min-w-0">
              <p className="font-bold text-ink-950">{item.description}</p>
              <p className="text-sm text-ink-700">
                {equipmentKindLabels[item.kind]}
                {item.powerBoard &&
                  ` · board ${item.powerBoard}${item.outlet ? `, outlet ${item.outlet}` : ''}`}
                {item.installedOn && ` · installed ${formatDay(item.installedOn)}`}
              </p>
              {item.notes && <p className="mt-1 text-sm text-ink-700">{item.notes}</p>}
            </div>
            {item.maintenanceDueOn && (
              <p className={`text-sm font-bold ${overdue ? 'text-watch-700' : 'text-ink-700'}`}>
                {overdue && (
                  <span aria-hidden="true" className="mr-1">
                    ◆
                  </span>
                )}
                {overdue ? 'Maintenance overdue since' : 'Next maintenance'}{' '}
                {formatDay(item.maintenanceDueOn)}
              </p>
            )}
          </li>
        );
      })}
    </ul>
  );
}

import { compareOutlets, equipmentKindLabels, type EquipmentItem } from '@shared/schemas/equipment';
import { ElectricalCaution } from './electrical-caution';

interface Board {
  label: string;
  description: string | null;
  outlets: EquipmentItem[];
}

/** Groups the tank's equipment by the board and outlet it is plugged into, as labelled under the cabinet. */
export function boardsOf(equipment: readonly EquipmentItem[]): {
  boards: Board[];
  unplugged: EquipmentItem[];
} {
  const byLabel = new Map<string, Board>();
  for (const item of equipment) {
    if (!item.powerBoard) continue;
    const board = byLabel.get(item.powerBoard) ?? { label: item.powerBoard, description: null, outlets: [] };
    if (item.kind === 'power-board' && !item.outlet) board.description = item.description;
    else board.outlets.push(item);
    byLabel.set(item.powerBoard, board);
  }
  const boards = [...byLabel.values()].sort((a, b) => compareOutlets(a.label, b.label));
  for (const board of boards) board.outlets.sort((a, b) => compareOutlets(a.outlet, b.outlet));
  return { boards, unplugged: equipment.filter((item) => !item.powerBoard && item.kind !== 'power-board') };
}

/**
 * Every board with what each outlet feeds, so an owner can be told "switch off outlet 4 on
 * board B" on the phone and find it. Outlets are drawn as numbered sockets, not colours.
 */
export function PowerBoardMap({ equipment }: { equipment: readonly EquipmentItem[] }) {
  const { boards } = boardsOf(equipment);
  return (
    <div className="@container space-y-4">
      <ElectricalCaution />
      {boards.length === 0 ? (
        <p className="rounded-card border border-dashed border-ink-300 bg-white p-5 text-sm text-ink-700">
          No power boards are recorded for this tank yet. Your technician labels them at the next visit.
        </p>
      ) : (
        <ul className="grid gap-4 @3xl:grid-cols-2">
          {boards.map((board) => (
            <li key={board.label} className="rounded-card bg-white p-4 shadow-card">
              <h3 className="flex items-center gap-3 text-lg font-bold text-ink-900">
                <span
                  aria-hidden="true"
                  className="flex h-10 w-10 items-center justify-center rounded-lg bg-ink-900 text-lg text-white"
                >
                  {board.label}
                </span>
                Board {board.label}
              </h3>
              {board.description && <p className="mt-1 text-sm text-ink-700">{board.description}</p>}
              {board.outlets.length === 0 ? (
                <p className="mt-3 text-sm text-ink-700">Nothing recorded on this board.</p>
              ) : (
                <ol
                  className="mt-3 grid gap-2 @md:grid-cols-2"
                  aria-label={`Outlets on board ${board.label}`}
                >
                  {board.outlets.map((item) => (
                    <li
                      key={item.id}
                      className="flex min-h-14 items-center gap-3 rounded-lg border-2 border-ink-100 bg-ink-50 p-2"
                    >
                      <span
                        aria-hidden="true"
                        className="flex h-10 w-10 shrink-0 items-center justify-center rounded-full border-2 border-ink-700 bg-white font-bold text-ink-900"
                      >
                        {item.outlet ?? '?'}
                      </span>
                      <span className="min-w-0 break-words">
                        <span className="sr-only">Outlet {item.outlet ?? 'not labelled'}: </span>
                        <span className="block font-bold text-ink-950">{item.description}</span>
                        <span className="block text-xs text-ink-700">{equipmentKindLabels[item.kind]}</span>
                      </span>
                    </li>
                  ))}
                </ol>
              )}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

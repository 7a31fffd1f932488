import { Link } from 'react-router';
import { Button } from './button';
import { SheetDialog } from './sheet-dialog';

/**
 * "Which tank?" for someone with several: each tank a large target leading to `hrefOf(tank)`,
 * with an optional line beside its name (an unread count, say).
 */
export function TankChoiceSheet<T extends { id: string; name: string }>({
  title,
  tanks,
  hrefOf,
  asideOf,
  onClose,
}: {
  title: string;
  tanks: readonly T[];
  hrefOf: (tank: T) => string;
  asideOf?: (tank: T) => string;
  onClose: () => void;
}) {
  return (
    <SheetDialog title={title} onClose={onClose}>
      <ul className="grid gap-2">
        {tanks.map((tank) => (
          <li key={tank.id}>
            <Link
              to={hrefOf(tank)}
              onClick={onClose}
              className="flex min-h-14 items-center justify-between gap-2 rounded-lg border-2 border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:border-ink-700"
            >
              {tank.name}
              {asideOf ? (
                <span className="text-sm font-normal text-ink-700">{asideOf(tank)}</span>
              ) : (
                <span aria-hidden="true">→</span>
              )}
            </Link>
          </li>
        ))}
      </ul>
      <div className="mt-4 flex justify-end">
        <Button tone="secondary" onClick={onClose}>
          Cancel
        </Button>
      </div>
    </SheetDialog>
  );
}

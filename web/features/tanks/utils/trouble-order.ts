import type { TankStatus } from '@shared/parameters/health';

/** Worst first: the tank that needs someone goes to the top of the screen, not where its name falls. */
const statusRank: Readonly<Record<TankStatus, number>> = { alert: 0, watch: 1, 'no-data': 2, healthy: 3 };

const byName = new Intl.Collator('en-GB', { sensitivity: 'base', numeric: true });

export function byTrouble<T extends { status: TankStatus; name: string }>(tanks: readonly T[]): T[] {
  return [...tanks].sort(
    (a, b) => statusRank[a.status] - statusRank[b.status] || byName.compare(a.name, b.name),
  );
}

/*
 * The API words why a tank has its status (`statusReason`) and may one day send when it last
 * heard from it (`lastReadingAt`). Both are read defensively, so a screen shows them when the
 * answer has them and leaves them out when an older API does not.
 */

interface MaybeExplained {
  statusReason?: unknown;
  lastReadingAt?: unknown;
}

export function statusReason(tank: object): string | null {
  const { statusReason: reason } = tank as MaybeExplained;
  return typeof reason === 'string' && reason.trim() !== '' ? reason : null;
}

export function lastReadingAt(tank: object): string | null | undefined {
  const { lastReadingAt: at } = tank as MaybeExplained;
  if (at === null) return null;
  return typeof at === 'string' ? at : undefined;
}

import { deviceStaleAfterMs } from '@shared/parameters/catalogue';

export interface StaleDeviceOutcome {
  readonly stale: boolean;
  readonly silentForMs: number;
  readonly staleAfterMs: number;
}

/**
 * Same rule as tank health: silent for strictly longer than `staleAfterMs`. For a device that has
 * never reported, pass the time it was added, so a new device gets the same grace.
 */
export function evaluateStaleDevice(
  lastSeen: Date,
  now: Date,
  staleAfterMs: number = deviceStaleAfterMs,
): StaleDeviceOutcome {
  const silentForMs = Math.max(0, now.getTime() - lastSeen.getTime());
  return { stale: silentForMs > staleAfterMs, silentForMs, staleAfterMs };
}

import { deviceStaleAfterMs } from '@shared/parameters/catalogue';

export interface DeviceSightings {
  /** Null while the device has never sent a reading. */
  readonly lastSeenAt: Date | null;
  readonly createdAt: Date;
}

export interface StaleDeviceOutcome {
  readonly stale: boolean;
  readonly silentForMs: number;
  readonly staleAfterMs: number;
}

/**
 * Same rule as tank health: silent for strictly longer than `staleAfterMs`. A device that has never
 * reported is measured from when it was added: a new device gets the same grace as a reading, and
 * one set up but never connected is stale once that grace has passed rather than never.
 */
export function evaluateStaleDevice(
  device: DeviceSightings,
  now: Date,
  staleAfterMs: number = deviceStaleAfterMs,
): StaleDeviceOutcome {
  const since = device.lastSeenAt ?? device.createdAt;
  const silentForMs = Math.max(0, now.getTime() - since.getTime());
  return { stale: silentForMs > staleAfterMs, silentForMs, staleAfterMs };
}

import type { Clock } from '../../api/lib/clock';

export interface TestClock {
  now: Clock;
  advance(ms: number): void;
  set(date: Date): void;
  /** Back to the start (or the real time); call it after a test that moved the clock. */
  reset(): void;
}

/**
 * With a start: a frozen clock that moves only when told (pure rule tests). Without: the real
 * time plus an offset that tests change, so time still passes for a running server.
 */
export function createTestClock(start?: Date): TestClock {
  const base = start?.getTime() ?? null;
  let offset = 0;
  const origin = () => base ?? Date.now();
  return {
    now: () => new Date(origin() + offset),
    advance: (ms) => {
      offset += ms;
    },
    set: (date) => {
      offset = date.getTime() - origin();
    },
    reset: () => {
      offset = 0;
    },
  };
}

export const minutes = (n: number) => n * 60_000;
export const hours = (n: number) => n * 3_600_000;
export const days = (n: number) => n * 86_400_000;

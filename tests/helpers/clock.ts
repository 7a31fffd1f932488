import type { Clock } from '../../api/lib/clock';

export interface TestClock {
  now: Clock;
  advance(ms: number): void;
  set(date: Date): void;
  /** Back to the real time; call it after a test that moved the clock. */
  reset(): void;
}

/** A clock that starts at the real time and moves only when a test says so. */
export function createTestClock(start = new Date()): TestClock {
  let current = start.getTime();
  return {
    now: () => new Date(current),
    advance: (ms) => {
      current += ms;
    },
    set: (date) => {
      current = date.getTime();
    },
    reset: () => {
      current = Date.now();
    },
  };
}

export const minutes = (n: number) => n * 60_000;
export const hours = (n: number) => n * 3_600_000;
export const days = (n: number) => n * 86_400_000;

/*
 * How the urgent screens say ages: whole minutes the way a dispatcher says them ("18 min",
 * "1 h 05 min"). Fees are written by formatMoney in shared/billing/money.ts.
 */

const minuteMs = 60_000;

/** "under 1 min", "18 min", "1 h 05 min", "2 d 3 h". */
export function formatAge(ms: number): string {
  const minutes = Math.max(0, Math.floor(ms / minuteMs));
  if (minutes < 1) return 'under 1 min';
  if (minutes < 60) return `${minutes} min`;
  const hours = Math.floor(minutes / 60);
  if (hours < 24) return `${hours} h ${String(minutes % 60).padStart(2, '0')} min`;
  return `${Math.floor(hours / 24)} d ${hours % 24} h`;
}

/**
 * How long a request has waited for acknowledgement against the company's target, at `now`: over
 * the target once the wait is longer than it (a request acknowledged is no longer judged here).
 */
export function waitAgainstTarget(createdAt: string, ackTargetMinutes: number, now: number) {
  const waitedMs = Math.max(0, now - Date.parse(createdAt));
  const targetMs = ackTargetMinutes * minuteMs;
  return { waitedMs, overByMs: waitedMs > targetMs ? waitedMs - targetMs : null };
}

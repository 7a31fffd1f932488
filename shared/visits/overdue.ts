const dayMs = 86_400_000;

/**
 * A tank is overdue for service when its last published visit is older than its service interval;
 * a tank never visited counts from the day it joined Brinewatch, so a new client is not overdue
 * on day one.
 */
export function visitOverdue(
  tank: { lastVisitAt: Date | null; createdAt: Date; serviceIntervalDays: number },
  now: Date,
): boolean {
  const since = tank.lastVisitAt ?? tank.createdAt;
  return now.getTime() - since.getTime() > tank.serviceIntervalDays * dayMs;
}

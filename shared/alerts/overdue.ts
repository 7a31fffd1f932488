export interface OverdueOutcome {
  readonly overdue: boolean;
  /** Null when the parameter has never been tested. */
  readonly dueAt: Date | null;
  /** Null when never tested; 0 while not yet due. */
  readonly overdueByMs: number | null;
  /** Always low urgency: an overdue test is a reminder, not an alarm. */
  readonly severity: 'notice';
}

export function evaluateOverdue(lastMeasuredAt: Date | null, intervalMs: number, now: Date): OverdueOutcome {
  if (lastMeasuredAt === null) return { overdue: true, dueAt: null, overdueByMs: null, severity: 'notice' };
  const dueAt = new Date(lastMeasuredAt.getTime() + intervalMs);
  const overdueByMs = Math.max(0, now.getTime() - dueAt.getTime());
  return { overdue: overdueByMs > 0, dueAt, overdueByMs, severity: 'notice' };
}

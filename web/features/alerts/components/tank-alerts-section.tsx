import { Link } from 'react-router';
import { tankSummaryAlertStatus } from '@shared/first-load/api-paths';
import type { AlertView } from '@shared/schemas/alerts';
import { AlertStatusBadge, SeverityBadge, severityEdge } from '../../../components/alert-badges';
import { ErrorState, LoadingState } from '../../../components/states';
import { can, useMe } from '../../../lib/auth';
import { formatDateTime, relativeTime, useNow } from '../../../lib/format';
import { useAlerts } from '../api/list-alerts';
import { openAlertFirstSteps } from '../utils/alert-facts';
import { AlertFactsList } from './alert-facts-list';
import { FirstStepsPanel } from './first-steps-panel';

function OpenAlert({ alert, now }: { alert: AlertView; now: number }) {
  const steps = openAlertFirstSteps(alert);
  const titleId = `tank-alert-${alert.id}-title`;
  return (
    <article
      aria-labelledby={titleId}
      className={`rounded-card border-l-8 bg-white p-4 shadow-card sm:p-5 ${severityEdge[alert.severity]}`}
    >
      <div className="flex flex-wrap items-center gap-2">
        <SeverityBadge severity={alert.severity} />
        <AlertStatusBadge status={alert.status} />
      </div>
      <h3 id={titleId} className="mt-2 text-lg font-bold text-ink-900">
        {alert.title}
      </h3>
      <p className="mt-1 text-ink-900">{alert.body}</p>
      {alert.status === 'acknowledged' && (
        <p className="mt-2 font-bold text-brine-700">
          {alert.acknowledgedBy ?? 'Your service company'} is on it.
        </p>
      )}
      <AlertFactsList alert={alert} now={now} />
      {steps && <FirstStepsPanel steps={steps} headingLevel={4} />}
    </article>
  );
}

/** A tank's open alerts (with what to do first) and the last few it recovered from, live. */
export function TankAlertsSection({
  tankId,
  recentResolved = 5,
}: {
  tankId: string;
  recentResolved?: number;
}) {
  const alerts = useAlerts({ tankId, status: tankSummaryAlertStatus });
  const { data: me } = useMe();
  const now = useNow();
  const open = alerts.data?.filter((alert) => alert.status !== 'resolved') ?? [];
  const resolved = (alerts.data ?? [])
    .filter((alert) => alert.status === 'resolved')
    .sort((a, b) => Date.parse(b.resolvedAt ?? b.openedAt) - Date.parse(a.resolvedAt ?? a.openedAt))
    .slice(0, recentResolved);
  const staff = can(me, 'alerts:manage');

  return (
    <section aria-labelledby="tank-alerts-title" className="grid gap-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="tank-alerts-title" className="text-xl font-bold text-ink-900">
          Alerts
        </h2>
        {staff && (
          <Link
            to={`/console/alerts?tankId=${tankId}`}
            className="inline-flex min-h-11 items-center font-bold text-brine-700"
          >
            Open on the alerts board
          </Link>
        )}
      </div>
      {alerts.isPending ? (
        <LoadingState label="Loading alerts…" />
      ) : alerts.isError ? (
        <ErrorState error={alerts.error} what="this tank’s alerts" onRetry={() => void alerts.refetch()} />
      ) : (
        <>
          <div aria-live="polite" className="grid gap-4">
            {open.length === 0 ? (
              <p className="flex items-center gap-2 rounded-card bg-white p-4 text-ink-900 shadow-card">
                <svg viewBox="0 0 12 12" className="h-4 w-4 shrink-0 text-healthy-700" aria-hidden="true">
                  <path d="M1.5 6.5 4.5 9.5 10.5 2.5" fill="none" stroke="currentColor" strokeWidth="2" />
                </svg>
                No open alerts for this tank.
              </p>
            ) : (
              open.map((alert) => <OpenAlert key={alert.id} alert={alert} now={now} />)
            )}
          </div>
          <div>
            <h3 className="font-bold text-ink-900">Recently resolved</h3>
            {resolved.length === 0 ? (
              <p className="mt-1 text-sm text-ink-700">Nothing resolved yet.</p>
            ) : (
              <ol className="mt-2 space-y-3 border-l-2 border-ink-100 pl-4">
                {resolved.map((alert) => (
                  <li key={alert.id}>
                    <p className="flex flex-wrap items-center gap-2 text-ink-900">
                      <SeverityBadge severity={alert.severity} />
                      <span>{alert.title}</span>
                    </p>
                    <p className="text-sm text-ink-700">
                      Opened {formatDateTime(alert.openedAt)}
                      {alert.resolvedAt && (
                        <>
                          {' · resolved '}
                          <time dateTime={alert.resolvedAt} title={formatDateTime(alert.resolvedAt)}>
                            {relativeTime(alert.resolvedAt, now)}
                          </time>
                        </>
                      )}
                    </p>
                  </li>
                ))}
              </ol>
            )}
          </div>
        </>
      )}
    </section>
  );
}

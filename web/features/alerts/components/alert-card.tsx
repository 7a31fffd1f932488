import type { AlertView } from '@shared/schemas/alerts';
import { AlertStatusBadge, SeverityBadge, severityEdge } from '../../../components/alert-badges';
import { Button } from '../../../components/button';
import { criticalFirstSteps } from '../utils/alert-facts';
import { AlertActions } from './alert-actions';
import { AlertFactsList } from './alert-facts-list';
import { FirstStepsPanel } from './first-steps-panel';

/** One alert on the staff board: what, where, how far past the limit, since when, and what to do. */
export function AlertCard({
  alert,
  now,
  onOpen,
  onDone,
}: {
  alert: AlertView;
  now: number;
  onOpen: (alertId: string) => void;
  onDone: (message: string) => void;
}) {
  const titleId = `alert-${alert.id}-title`;
  const steps = criticalFirstSteps(alert);
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
      <p className="text-sm text-ink-700">
        <span className="font-bold text-ink-900">{alert.tank.name}</span>
        {alert.tank.siteLabel && <> · {alert.tank.siteLabel}</>}
      </p>
      {/* The full wording is in the detail panel; the board stays scannable. */}
      <p className="mt-2 line-clamp-3 text-ink-900">{alert.body}</p>
      <AlertFactsList alert={alert} now={now} />
      {steps && (
        <details className="mt-3">
          <summary className="inline-flex min-h-11 cursor-pointer items-center font-bold text-brine-700">
            First steps and cautions for the owner
          </summary>
          <FirstStepsPanel steps={steps} headingLevel={4} />
        </details>
      )}
      <div className="mt-4 flex flex-col gap-3 sm:flex-row sm:items-start sm:justify-between">
        <div className="min-w-0 sm:flex-1">
          <AlertActions alert={alert} onDone={onDone} />
        </div>
        <Button tone="secondary" onClick={() => onOpen(alert.id)} className="self-start">
          Details and timeline<span className="sr-only">: {alert.title}</span>
        </Button>
      </div>
    </article>
  );
}

import type { AlertSeverity, AlertStatus } from '@shared/alerts/kinds';
import { Badge } from './badge';

export const severityLabels: Record<AlertSeverity, string> = {
  critical: 'Critical',
  warning: 'Warning',
  notice: 'Notice',
};

const severityTones: Record<AlertSeverity, string> = {
  critical: 'bg-alert-100 text-alert-700',
  warning: 'bg-watch-100 text-watch-700',
  notice: 'bg-nodata-100 text-nodata-700',
};

/** The stripe down the edge of an alert, in the severity's colour (the badge carries shape and word). */
export const severityEdge: Record<AlertSeverity, string> = {
  critical: 'border-l-alert-700',
  warning: 'border-l-watch-700',
  notice: 'border-l-nodata-700',
};

// Brinewatch's severity marks: a solid diamond, a half-filled diamond, an empty ring.
function SeverityMark({ severity }: { severity: AlertSeverity }) {
  return (
    <svg viewBox="0 0 12 12" className="h-3 w-3 shrink-0" aria-hidden="true" focusable="false">
      {severity === 'critical' && <path d="M6 0.5 11.5 6 6 11.5 0.5 6z" fill="currentColor" />}
      {severity === 'warning' && (
        <>
          <path d="M6 1.2 10.8 6 6 10.8 1.2 6z" fill="none" stroke="currentColor" strokeWidth="1.4" />
          <path d="M6 1.2 1.2 6 6 10.8z" fill="currentColor" />
        </>
      )}
      {severity === 'notice' && (
        <circle cx="6" cy="6" r="4.5" fill="none" stroke="currentColor" strokeWidth="1.6" />
      )}
    </svg>
  );
}

export function SeverityBadge({ severity }: { severity: AlertSeverity }) {
  return (
    <Badge tone={severityTones[severity]} mark={<SeverityMark severity={severity} />}>
      {severityLabels[severity]}
    </Badge>
  );
}

export const statusLabels: Record<AlertStatus, string> = {
  open: 'Open',
  acknowledged: 'Acknowledged',
  resolved: 'Resolved',
};

const statusTones: Record<AlertStatus, string> = {
  open: 'border-ink-700 text-ink-900',
  acknowledged: 'border-brine-700 text-brine-700',
  resolved: 'border-healthy-700 text-healthy-700',
};

// Open: an empty ring. Acknowledged: a ring with someone in it. Resolved: a tick.
function StatusMark({ status }: { status: AlertStatus }) {
  return (
    <svg viewBox="0 0 12 12" className="h-3 w-3 shrink-0" aria-hidden="true" focusable="false">
      {status !== 'resolved' && (
        <circle cx="6" cy="6" r="4.6" fill="none" stroke="currentColor" strokeWidth="1.6" />
      )}
      {status === 'acknowledged' && <circle cx="6" cy="6" r="2" fill="currentColor" />}
      {status === 'resolved' && (
        <path d="M1.5 6.5 4.5 9.5 10.5 2.5" fill="none" stroke="currentColor" strokeWidth="2" />
      )}
    </svg>
  );
}

export function AlertStatusBadge({ status }: { status: AlertStatus }) {
  return (
    <Badge tone={`border bg-white ${statusTones[status]}`} mark={<StatusMark status={status} />}>
      {statusLabels[status]}
    </Badge>
  );
}

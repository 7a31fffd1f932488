import type { AlertEventView, AlertView } from '@shared/schemas/alerts';
import { formatValue } from '@shared/parameters/units';
import { SeverityBadge, severityLabels } from '../../../components/alert-badges';
import { formatDateTime, relativeTime } from '../../../lib/format';

function describeEvent(event: AlertEventView): string {
  const who = event.actorName;
  switch (event.type) {
    case 'opened':
      return 'Opened';
    case 'escalated':
      return `Became ${severityLabels[event.severity].toLowerCase()}`;
    case 'de-escalated':
      return `Eased to ${severityLabels[event.severity].toLowerCase()}`;
    case 'acknowledged':
      return who ? `Acknowledged by ${who}` : 'Acknowledged';
    case 'resolved':
      return who ? `Resolved by ${who}` : 'Resolved: back within limits';
  }
}

function eventValue(alert: AlertView, event: AlertEventView): string | null {
  if (event.value === null) return null;
  if (alert.kind === 'free-ammonia') return `${event.value.toFixed(3)} mg/L free ammonia`;
  return alert.parameter ? formatValue(alert.parameter, event.value) : null;
}

/** Every step of an alert's life, oldest first, with who did what and what they wrote. */
export function AlertTimeline({ alert, now }: { alert: AlertView; now: number }) {
  const events = alert.events ?? [];
  if (events.length === 0) return <p className="text-ink-700">Nothing has been recorded yet.</p>;
  return (
    <ol className="relative space-y-4 border-l-2 border-ink-100 pl-5">
      {events.map((event) => {
        const value = eventValue(alert, event);
        return (
          <li key={event.id} className="relative">
            <span
              aria-hidden="true"
              className="absolute -left-[1.6rem] top-1.5 h-2.5 w-2.5 rounded-full border-2 border-ink-700 bg-white"
            />
            <div className="flex flex-wrap items-center gap-2">
              <p className="font-bold text-ink-900">{describeEvent(event)}</p>
              {(event.type === 'opened' || event.type === 'escalated' || event.type === 'de-escalated') && (
                <SeverityBadge severity={event.severity} />
              )}
            </div>
            <p className="text-sm text-ink-700">
              <time dateTime={event.at}>{formatDateTime(event.at)}</time> · {relativeTime(event.at, now)}
              {value && <> · reading {value}</>}
            </p>
            {event.note && (
              <blockquote className="mt-1 rounded-md bg-ink-50 px-3 py-2 text-ink-900">
                {event.note}
              </blockquote>
            )}
          </li>
        );
      })}
    </ol>
  );
}

import type { UrgentRequestView } from '@shared/schemas/urgent-requests';
import { urgentStatusNames, urgentStatuses, type UrgentStatus } from '@shared/urgent/lifecycle';
import { formatDateTime } from '../../../lib/format';

/** The way a request goes when it goes well; a declined one stops where it was declined. */
const path: readonly UrgentStatus[] = urgentStatuses.filter((status) => status !== 'declined');

/** When the request last entered `status`, from its events. */
function reachedAt(request: UrgentRequestView, status: UrgentStatus): string | null {
  if (status === 'requested') return request.createdAt;
  return request.events.findLast((event) => event.type === status)?.at ?? null;
}

/**
 * Where the request stands, as a row of steps on a desktop and a column on a phone: each step done
 * is ticked with its time (in the tank's zone), the current one is named as such, the rest are
 * still to come (small dashed tiles on a phone). A change of status is read out (the region is live).
 */
export function UrgentStatusStepper({ request }: { request: UrgentRequestView }) {
  const declined = request.status === 'declined';
  // A declined request shows the steps it reached, then "Declined".
  const lastReached = declined
    ? Math.max(0, ...path.map((status, index) => (reachedAt(request, status) ? index : 0)))
    : path.indexOf(request.status);
  const steps: readonly UrgentStatus[] = declined ? [...path.slice(0, lastReached + 1), 'declined'] : path;
  const current = declined ? steps.length - 1 : lastReached;
  return (
    <div>
      <p aria-live="polite" className="sr-only">
        Status: {urgentStatusNames[request.status]}
      </p>
      <ol
        aria-label="Progress of the request"
        className="flex flex-wrap gap-2 md:grid md:grid-flow-col md:auto-cols-fr"
      >
        {steps.map((status, index) => {
          const done = index < current || (index === current && (status === 'resolved' || declined));
          const isCurrent = index === current;
          // On a phone the steps still to come fold into small tiles in a row, so the answer above
          // and staff's next step below stay near the first screen.
          const toCome = index > current;
          const at = index <= current ? reachedAt(request, status) : null;
          // A closed request has no "now": its last step is simply when it ended.
          const final = isCurrent && (status === 'resolved' || status === 'declined');
          const state = final ? null : isCurrent ? 'Now' : index < current ? 'Done' : 'To come';
          return (
            <li
              key={status}
              aria-current={isCurrent ? 'step' : undefined}
              className={`flex min-w-0 items-start gap-3 rounded-lg border-2 p-2 md:flex-col md:gap-1 ${
                toCome ? 'max-md:items-center max-md:gap-1.5 max-md:py-1 max-md:pr-3' : 'w-full'
              } ${
                isCurrent
                  ? status === 'declined'
                    ? 'border-nodata-700 bg-nodata-100'
                    : 'border-ink-800 bg-brine-100'
                  : index < current
                    ? 'border-ink-100 bg-white'
                    : 'border-dashed border-ink-300 bg-white'
              }`}
            >
              <span
                aria-hidden="true"
                className={`flex shrink-0 items-center justify-center rounded-full font-bold ${
                  toCome ? 'h-6 w-6 text-xs md:h-7 md:w-7 md:text-sm' : 'h-7 w-7 text-sm'
                } ${
                  done || index < current
                    ? 'bg-ink-800 text-white'
                    : isCurrent
                      ? 'border-2 border-ink-800 bg-white text-ink-900'
                      : 'border-2 border-dashed border-ink-300 text-ink-600'
                }`}
              >
                {status === 'declined' ? '✕' : done || index < current ? '✓' : index + 1}
              </span>
              <span className="min-w-0">
                <span
                  className={`block ${isCurrent ? 'font-bold text-ink-950' : 'text-ink-900'} ${
                    toCome ? 'max-md:text-sm' : ''
                  }`}
                >
                  {urgentStatusNames[status]}
                </span>
                <span className={`block text-xs text-ink-700 ${toCome ? 'max-md:sr-only' : ''}`}>
                  {state}
                  {at && (
                    <>
                      {state && ' · '}
                      <time dateTime={at}>{formatDateTime(at, request.timeZone)}</time>
                    </>
                  )}
                </span>
              </span>
            </li>
          );
        })}
      </ol>
    </div>
  );
}

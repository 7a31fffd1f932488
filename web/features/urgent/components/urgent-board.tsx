import { Link } from 'react-router';
import type { UrgentRequestView } from '@shared/schemas/urgent-requests';
import { urgentCategoryNames } from '@shared/urgent/categories';
import { Badge } from '../../../components/badge';
import { StatusShape } from '../../../components/status-badges';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { formatDateTime, relativeTime, useNow } from '../../../lib/format';
import { useUrgentBoard, type UrgentBoardState } from '../api/list-urgent-requests';
import { formatAge, waitAgainstTarget } from '../utils/urgent-text';
import { UrgentStatusBadge } from './urgent-status-badge';

/** How long it has waited against the company's target; only a request not yet acknowledged is judged. */
function AgeLine({ request, now }: { request: UrgentRequestView; now: number }) {
  const { waitedMs: age, overByMs } = waitAgainstTarget(request.createdAt, request.ackTargetMinutes, now);
  if (request.status !== 'requested') {
    const tookMs = request.acknowledgedAt
      ? Date.parse(request.acknowledgedAt) - Date.parse(request.createdAt)
      : null;
    return (
      <p className="text-sm text-ink-700">
        Open for <span className="font-bold text-ink-900">{formatAge(age)}</span>
        {tookMs !== null && (
          <>
            {' '}
            · acknowledged after {formatAge(tookMs)} (target {request.ackTargetMinutes} min)
          </>
        )}
      </p>
    );
  }
  const over = overByMs !== null;
  return (
    <p className={`flex flex-wrap items-center gap-x-2 gap-y-1 ${over ? 'text-alert-700' : 'text-ink-900'}`}>
      {over && <StatusShape tone="alert" className="h-5 w-5" />}
      <span>
        Waiting <span className="text-lg font-bold">{formatAge(age)}</span>
      </span>
      <span className="text-sm">
        {over
          ? `Over target: ${formatAge(overByMs)} past ${request.ackTargetMinutes} min`
          : `target ${request.ackTargetMinutes} min`}
      </span>
    </p>
  );
}

function BoardItem({
  request,
  now,
  state,
}: {
  request: UrgentRequestView;
  now: number;
  state: UrgentBoardState;
}) {
  const waiting = request.status === 'requested';
  return (
    <article
      aria-labelledby={`urgent-${request.id}`}
      className={`relative grid gap-2 rounded-card bg-white p-4 shadow-card focus-within:outline-3 focus-within:outline-offset-2 focus-within:outline-brine-500 hover:shadow-lg ${
        waiting && state === 'open' ? 'border-4 border-alert-700' : 'border-l-8 border-ink-300'
      }`}
    >
      <div className="flex flex-wrap items-start justify-between gap-2">
        <h2 id={`urgent-${request.id}`} className="min-w-0 text-lg leading-snug font-bold text-ink-900">
          <Link
            to={`/urgent/${request.id}`}
            className="text-ink-900 no-underline after:absolute after:inset-0 after:content-[''] focus:outline-none"
          >
            {request.tankName}
          </Link>
          <span className="block text-base font-normal text-ink-900">
            {urgentCategoryNames[request.category].label}
          </span>
        </h2>
        <div className="flex flex-wrap gap-1">
          <UrgentStatusBadge status={request.status} />
          {request.escalationLevel > 0 && (
            <Badge tone="border border-alert-700/40 bg-white text-alert-700" mark={<span>▲</span>}>
              Escalated, level {request.escalationLevel}
            </Badge>
          )}
        </div>
      </div>
      {waiting && state === 'open' && <p className="font-bold text-alert-700">Needs acknowledging</p>}
      {state === 'open' ? (
        <AgeLine request={request} now={now} />
      ) : (
        request.closedAt && (
          <p className="text-sm text-ink-700">
            Closed{' '}
            <time dateTime={request.closedAt}>{formatDateTime(request.closedAt, request.timeZone)}</time> (
            {relativeTime(request.closedAt, now)})
          </p>
        )
      )}
      <p className="text-sm text-ink-700">
        From {request.requestedBy.name}
        {request.technician && <> · technician {request.technician.name}</>}
        {request.eta && state === 'open' && (
          <>
            {' '}
            · arrival expected{' '}
            <time dateTime={request.eta}>{formatDateTime(request.eta, request.timeZone)}</time>
          </>
        )}
      </p>
    </article>
  );
}

/**
 * Every urgent request, for staff: the open ones oldest first, each with how long it has waited
 * (ticking every 30 s) against the company's target; the requests nobody has acknowledged stand out.
 * New requests and moves arrive through the event stream.
 */
export function UrgentBoard({ state }: { state: UrgentBoardState }) {
  const board = useUrgentBoard(state);
  const now = useNow(30_000);
  if (board.isPending) return <LoadingState label="Loading urgent requests…" />;
  if (board.isError)
    return <ErrorState error={board.error} what="the urgent requests" onRetry={() => void board.refetch()} />;
  if (board.data.length === 0)
    return (
      <EmptyState title={state === 'open' ? 'No open urgent requests' : 'No closed urgent requests yet'}>
        {state === 'open'
          ? 'New requests appear here at once, and the technician on call is told.'
          : 'Resolved and declined requests are listed here.'}
      </EmptyState>
    );
  const waiting = board.data.filter((request) => request.status === 'requested').length;
  return (
    <>
      {state === 'open' && (
        <p className="mb-3 text-ink-900" aria-live="polite">
          {board.data.length} open ·{' '}
          <span className={waiting > 0 ? 'font-bold text-alert-700' : undefined}>
            {waiting} waiting for acknowledgement
          </span>
        </p>
      )}
      <ul className="grid gap-3 lg:grid-cols-2">
        {board.data.map((request) => (
          <li key={request.id}>
            <BoardItem request={request} now={now} state={state} />
          </li>
        ))}
      </ul>
    </>
  );
}

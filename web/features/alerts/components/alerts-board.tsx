import { useCallback, useRef, useState } from 'react';
import { useSearchParams } from 'react-router';
import { alertListQuery } from '@shared/schemas/alerts';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { useNow } from '../../../lib/format';
import { useAlerts, type AlertFilters } from '../api/list-alerts';
import { AlertCard } from './alert-card';
import { AlertDrawer } from './alert-drawer';
import { AlertFiltersBar, boardStatusLabels } from './alert-filters';

function filtersFrom(params: URLSearchParams) {
  const read = alertListQuery.safeParse(Object.fromEntries(params));
  const { status, severity, tankId } = read.success ? read.data : alertListQuery.parse({});
  return { status, severity, tankId };
}

const listHeadings: Record<string, string> = {
  active: 'Alerts not yet resolved',
  open: 'Open alerts',
  acknowledged: 'Acknowledged alerts',
  resolved: 'Resolved alerts',
  all: 'All alerts',
};

const emptyWords: Record<string, string> = {
  active: 'No open alerts right now.',
  open: 'No alerts are waiting for someone to pick them up.',
  acknowledged: 'No acknowledged alerts.',
  resolved: 'No resolved alerts yet.',
  all: 'No alerts yet.',
};

/** Every client tank's alerts, the most severe and the oldest first, updating live. */
export function AlertsBoard() {
  const [params, setParams] = useSearchParams();
  const filters = filtersFrom(params);
  const openAlertId = params.get('alert');
  const alerts = useAlerts(filters, { keepPrevious: true });
  const now = useNow();
  const [message, setMessage] = useState('');
  const listHeading = useRef<HTMLHeadingElement>(null);

  const setFilters = useCallback(
    (next: AlertFilters) =>
      setParams(
        (current) => {
          const updated = new URLSearchParams(current);
          for (const key of ['status', 'severity', 'tankId'] as const) {
            const value = next[key];
            if (value && !(key === 'status' && value === 'active')) updated.set(key, value);
            else updated.delete(key);
          }
          return updated;
        },
        { replace: true },
      ),
    [setParams],
  );

  const openDetail = (alertId: string) =>
    setParams((current) => {
      const updated = new URLSearchParams(current);
      updated.set('alert', alertId);
      return updated;
    });

  const closeDetail = useCallback(
    () =>
      setParams(
        (current) => {
          if (!current.has('alert')) return current;
          const updated = new URLSearchParams(current);
          updated.delete('alert');
          return updated;
        },
        { replace: true },
      ),
    [setParams],
  );

  // A resolved alert may leave the list it was in, so the news and the focus go to the list's heading.
  const done = (text: string) => {
    setMessage(text);
    if (!openAlertId) listHeading.current?.focus();
  };

  const count = alerts.data?.length ?? 0;
  const what = boardStatusLabels[filters.status].toLowerCase();
  return (
    <div className="grid gap-4">
      <AlertFiltersBar filters={filters} onChange={setFilters} />
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 ref={listHeading} tabIndex={-1} className="text-xl font-bold text-ink-900">
          {listHeadings[filters.status]}
        </h2>
        {alerts.isSuccess && (
          <p role="status" className="text-sm text-ink-700">
            {count === 1 ? '1 alert' : `${count} alerts`}
          </p>
        )}
      </div>
      <p
        role="status"
        aria-live="polite"
        className={message ? 'rounded-lg bg-healthy-100 p-3 font-bold text-healthy-700' : 'sr-only'}
      >
        {message}
      </p>
      {alerts.isPending ? (
        <LoadingState label="Loading alerts…" />
      ) : alerts.isError ? (
        <ErrorState error={alerts.error} what="the alerts" onRetry={() => void alerts.refetch()} />
      ) : count === 0 ? (
        <EmptyState title={emptyWords[filters.status] ?? `No ${what} alerts.`}>
          New alerts appear here as soon as a reading crosses a limit; there is no need to reload.
        </EmptyState>
      ) : (
        <ul className="grid gap-4" aria-label="Alerts">
          {alerts.data.map((alert) => (
            <li key={alert.id}>
              <AlertCard alert={alert} now={now} onOpen={openDetail} onDone={done} />
            </li>
          ))}
        </ul>
      )}
      <AlertDrawer alertId={openAlertId} onClose={closeDetail} onDone={setMessage} />
    </div>
  );
}

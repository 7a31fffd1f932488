import { useId } from 'react';
import { alertSeverities, type AlertSeverity } from '@shared/alerts/kinds';
import type { AlertListQuery } from '@shared/schemas/alerts';
import { useTanks } from '../../clients/api/list-tanks';
import type { AlertFilters } from '../api/alert-query-keys';
import { severityLabels } from './severity-badge';

export type BoardStatus = AlertListQuery['status'];

export const boardStatusLabels: Record<BoardStatus, string> = {
  active: 'Not resolved',
  open: 'Open',
  acknowledged: 'Acknowledged',
  resolved: 'Resolved',
  all: 'All',
};

const selectClass =
  'mt-1 min-h-12 w-full min-w-0 rounded-lg border-2 border-ink-300 bg-white px-3 text-base text-ink-950 focus:border-ink-700';

function Select({
  label,
  value,
  onChange,
  children,
}: {
  label: string;
  value: string;
  onChange: (value: string) => void;
  children: React.ReactNode;
}) {
  const id = useId();
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="block text-sm font-bold text-ink-900">
        {label}
      </label>
      <select
        id={id}
        value={value}
        onChange={(event) => onChange(event.target.value)}
        className={selectClass}
      >
        {children}
      </select>
    </div>
  );
}

/** Which alerts the board shows; every choice lives in the address, so a reload or a shared link keeps it. */
export function AlertFiltersBar({
  filters,
  onChange,
}: {
  filters: Required<Pick<AlertFilters, 'status'>> & AlertFilters;
  onChange: (next: AlertFilters) => void;
}) {
  const tanks = useTanks();
  return (
    <form
      role="search"
      aria-label="Filter alerts"
      onSubmit={(event) => event.preventDefault()}
      className="grid gap-3 rounded-card bg-white p-4 shadow-card sm:grid-cols-3"
    >
      <Select
        label="Status"
        value={filters.status}
        onChange={(status) => onChange({ ...filters, status: status as BoardStatus })}
      >
        {(Object.keys(boardStatusLabels) as BoardStatus[]).map((status) => (
          <option key={status} value={status}>
            {boardStatusLabels[status]}
          </option>
        ))}
      </Select>
      <Select
        label="Severity"
        value={filters.severity ?? ''}
        onChange={(severity) =>
          onChange({ ...filters, severity: (severity || undefined) as AlertSeverity | undefined })
        }
      >
        <option value="">Any severity</option>
        {[...alertSeverities].reverse().map((severity) => (
          <option key={severity} value={severity}>
            {severityLabels[severity]}
          </option>
        ))}
      </Select>
      <Select
        label="Tank"
        value={filters.tankId ?? ''}
        onChange={(tankId) => onChange({ ...filters, tankId: tankId || undefined })}
      >
        <option value="">All tanks</option>
        {filters.tankId && !tanks.data?.some((tank) => tank.id === filters.tankId) && (
          <option value={filters.tankId}>The chosen tank</option>
        )}
        {tanks.data?.map((tank) => (
          <option key={tank.id} value={tank.id}>
            {tank.siteLabel ? `${tank.name} — ${tank.siteLabel}` : tank.name}
          </option>
        ))}
      </Select>
    </form>
  );
}

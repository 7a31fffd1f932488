import { useEffect } from 'react';
import { z } from 'zod';
import { alertSeverities } from '@shared/alerts/kinds';
import { alertListQuery, type AlertListQuery } from '@shared/schemas/alerts';
import { severityLabels } from '../../../components/alert-badges';
import { Form, useZodForm } from '../../../components/form';
import { SelectField } from '../../../components/form-fields';
import { blankAsUndefined } from '../../../lib/form-values';
import { useTankChoices } from '../../../lib/queries/tank-choices';
import type { AlertFilters } from '../api/list-alerts';

export type BoardStatus = AlertListQuery['status'];

export const boardStatusLabels: Record<BoardStatus, string> = {
  active: 'Not resolved',
  open: 'Open',
  acknowledged: 'Acknowledged',
  resolved: 'Resolved',
  all: 'All',
};

const filtersForm = z.object({
  status: alertListQuery.shape.status,
  severity: blankAsUndefined(alertListQuery.shape.severity),
  tankId: blankAsUndefined(alertListQuery.shape.tankId),
});

const statusOptions = (Object.keys(boardStatusLabels) as BoardStatus[]).map((status) => ({
  value: status,
  label: boardStatusLabels[status],
}));

const severityOptions = [
  { value: '', label: 'Any severity' },
  ...[...alertSeverities].reverse().map((severity) => ({ value: severity, label: severityLabels[severity] })),
];

/** Which alerts the board shows; every choice lives in the address, so a reload or a shared link keeps it. */
export function AlertFiltersBar({
  filters,
  onChange,
}: {
  filters: Required<Pick<AlertFilters, 'status'>> & AlertFilters;
  onChange: (next: AlertFilters) => void;
}) {
  const tanks = useTankChoices();
  // The address is the truth: the form follows it (a link, the back button) and writes each choice to it.
  const form = useZodForm(filtersForm, {
    values: { status: filters.status, severity: filters.severity ?? '', tankId: filters.tankId ?? '' },
  });

  useEffect(() => {
    const subscription = form.watch((values, { name }) => {
      if (!name) return;
      const read = filtersForm.safeParse(values);
      if (read.success) onChange(read.data);
    });
    return () => subscription.unsubscribe();
  }, [form, onChange]);

  const tankOptions = [
    { value: '', label: 'All tanks' },
    ...(filters.tankId && !tanks.data?.some((tank) => tank.id === filters.tankId)
      ? [{ value: filters.tankId, label: 'The chosen tank' }]
      : []),
    ...(tanks.data ?? []).map((tank) => ({
      value: tank.id,
      label: tank.siteLabel ? `${tank.name} — ${tank.siteLabel}` : tank.name,
    })),
  ];

  return (
    <Form
      form={form}
      onSubmit={onChange}
      role="search"
      aria-label="Filter alerts"
      className="grid gap-3 rounded-card bg-white p-4 shadow-card sm:grid-cols-3"
    >
      <SelectField name="status" label="Status" options={statusOptions} />
      <SelectField name="severity" label="Severity" options={severityOptions} />
      <SelectField name="tankId" label="Tank" options={tankOptions} />
    </Form>
  );
}

import { useEffect } from 'react';
import { z } from 'zod';
import { tankStatusSchema, type TankStatus } from '@shared/parameters/health';
import { tankStyleLabels, tankStyles } from '@shared/parameters/limit-templates';
import { tankListQuery, tankOverviewQuery, type AssignableStaff } from '@shared/schemas/tanks';
import { Form, useZodForm } from '../../../components/form';
import { CheckboxGroupField, SelectField, TextField } from '../../../components/form-fields';
import { StatusShape, tankStatusWords, type StatusTone } from '../../../components/status-badges';
import { formatCount } from '../../../lib/format';
import { blankAsUndefined } from '../../../lib/form-values';
import type { TankOverviewFilters } from '../api/get-tank-overview';
import { overviewStatusOrder } from '../utils/overview-address';

const filterForm = z.object({
  q: blankAsUndefined(tankListQuery.shape.q),
  technicianId: blankAsUndefined(tankListQuery.shape.technicianId),
  status: z.array(tankStatusSchema),
  style: blankAsUndefined(tankOverviewQuery.shape.style),
});

const sameFilters = (a: TankOverviewFilters, b: TankOverviewFilters) =>
  (a.q ?? '') === (b.q ?? '') &&
  (a.technicianId ?? '') === (b.technicianId ?? '') &&
  (a.status ?? []).join() === (b.status ?? []).join() &&
  (a.style ?? '') === (b.style ?? '');

const shapeColour: Record<StatusTone, string> = {
  good: 'text-healthy-700',
  watch: 'text-watch-700',
  alert: 'text-alert-700',
  none: 'text-nodata-700',
};

/** "Alert (13)", with the status's shape so the choice reads as the badges in the list do. */
function StatusChoice({ status, count }: { status: TankStatus; count: number | undefined }) {
  const { label, tone } = tankStatusWords[status];
  return (
    <span className="inline-flex items-center gap-2">
      <StatusShape tone={tone} className={`h-4 w-4 ${shapeColour[tone]}`} />
      {count === undefined ? label : `${label} (${formatCount(count)})`}
    </span>
  );
}

/**
 * Search, technician, status and style for the console's tank list. The search waits for a pause
 * in typing so each keystroke does not become a request; the other choices apply at once.
 */
export function TankFilters({
  query,
  technicians,
  counts,
  onChange,
}: {
  query: TankOverviewFilters;
  technicians: readonly AssignableStaff[];
  /** Tanks per status under the other filters; unknown until the first page arrives. */
  counts: Record<TankStatus, number> | undefined;
  onChange: (query: TankOverviewFilters) => void;
}) {
  const form = useZodForm(filterForm, {
    mode: 'onChange',
    defaultValues: {
      q: query.q ?? '',
      technicianId: query.technicianId ?? '',
      status: query.status ?? [],
      style: query.style ?? '',
    },
  });
  const q = form.watch('q') ?? '';
  const technicianId = form.watch('technicianId') ?? '';
  const status = form.watch('status');
  const style = form.watch('style') ?? '';

  useEffect(() => {
    const parsed = filterForm.safeParse({ q, technicianId, status, style });
    if (!parsed.success) return;
    const next: TankOverviewFilters = {
      ...parsed.data,
      status: overviewStatusOrder.filter((one) => parsed.data.status.includes(one)),
    };
    if (sameFilters(next, query)) return;
    const typing = (next.q ?? '') !== (query.q ?? '');
    const timer = setTimeout(() => onChange(next), typing ? 250 : 0);
    return () => clearTimeout(timer);
  }, [q, technicianId, status, style, query, onChange]);

  return (
    <Form
      form={form}
      role="search"
      aria-label="Find tanks"
      onSubmit={(values) => onChange(values)}
      className="grid gap-3 rounded-card bg-white p-4 shadow-card sm:grid-cols-2 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_minmax(0,1fr)]"
    >
      <TextField
        name="q"
        label="Search"
        hint="Tank, site or client name"
        type="search"
        autoComplete="off"
        className="sm:col-span-2 lg:col-span-1"
      />
      <SelectField
        name="technicianId"
        label="Technician"
        hint="Who looks after the tank"
        options={[
          { value: '', label: 'Everyone' },
          { value: 'none', label: 'Nobody assigned' },
          ...technicians.map((person) => ({ value: person.id, label: person.name })),
        ]}
      />
      <SelectField
        name="style"
        label="Style"
        hint="The kind of tank"
        options={[
          { value: '', label: 'Every style' },
          ...tankStyles.map((one) => ({ value: one, label: tankStyleLabels[one] })),
        ]}
      />
      <CheckboxGroupField
        name="status"
        label="Status"
        hint="Tick none to see every status."
        className="sm:col-span-2 lg:col-span-3"
        columns="flex flex-wrap gap-x-6"
        options={overviewStatusOrder.map((one) => ({
          value: one,
          label: <StatusChoice status={one} count={counts?.[one]} />,
        }))}
      />
    </Form>
  );
}

import { useEffect } from 'react';
import { z } from 'zod';
import { tankListQuery, type AssignableStaff, type TankListQuery } from '@shared/schemas/tanks';
import { Form, useZodForm } from '../../../components/form';
import { SelectField, TextField } from '../../../components/form-fields';
import { blankAsUndefined } from '../../../lib/form-values';

const filterForm = z.object({
  q: blankAsUndefined(tankListQuery.shape.q),
  technicianId: blankAsUndefined(tankListQuery.shape.technicianId),
});

const sameQuery = (a: TankListQuery, b: TankListQuery) =>
  (a.q ?? '') === (b.q ?? '') && (a.technicianId ?? '') === (b.technicianId ?? '');

/**
 * Search and technician filter for the console's tank list. The search waits for a pause in
 * typing so each keystroke does not become a request; the technician applies at once.
 */
export function TankFilters({
  query,
  technicians,
  onChange,
}: {
  query: TankListQuery;
  technicians: readonly AssignableStaff[];
  onChange: (query: TankListQuery) => void;
}) {
  const form = useZodForm(filterForm, {
    mode: 'onChange',
    defaultValues: { q: query.q ?? '', technicianId: query.technicianId ?? '' },
  });
  const q = form.watch('q') ?? '';
  const technicianId = form.watch('technicianId') ?? '';

  useEffect(() => {
    const next = filterForm.safeParse({ q, technicianId });
    if (!next.success || sameQuery(next.data, query)) return;
    const typing = (next.data.q ?? '') !== (query.q ?? '');
    const timer = setTimeout(() => onChange(next.data), typing ? 250 : 0);
    return () => clearTimeout(timer);
  }, [q, technicianId, query, onChange]);

  return (
    <Form
      form={form}
      role="search"
      aria-label="Find tanks"
      onSubmit={(values) => onChange(values)}
      className="grid gap-3 rounded-card bg-white p-4 shadow-card sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]"
    >
      <TextField name="q" label="Search" hint="Tank, site or client name" type="search" autoComplete="off" />
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
    </Form>
  );
}

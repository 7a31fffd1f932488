import { useEffect } from 'react';
import { z } from 'zod';
import { invoiceKinds, invoiceStatuses, invoiceStatusLabels } from '@shared/billing/invoices';
import { invoiceListQuery } from '@shared/schemas/billing';
import { Form, useZodForm } from '../../../components/form';
import { SelectField, TextField } from '../../../components/form-fields';
import { blankAsUndefined } from '../../../lib/form-values';
import { useClients } from '../../../lib/queries/people';
import type { InvoiceFilters } from '../api/list-invoices';
import { sameInvoiceFilters } from '../utils/invoice-address';

const filterForm = z.object({
  status: blankAsUndefined(invoiceListQuery.shape.status),
  kind: blankAsUndefined(invoiceListQuery.shape.kind),
  clientId: blankAsUndefined(invoiceListQuery.shape.clientId),
  month: blankAsUndefined(invoiceListQuery.shape.month),
});
type FilterValues = { status: string; kind: string; clientId: string; month: string };

const kindLabels = { invoice: 'Invoices', 'credit-note': 'Credit notes' } as const;

/**
 * Status, kind, client and month for the staff list; each choice applies at once. A month typed by
 * hand (browsers without a month picker) waits until it reads as YYYY-MM.
 */
export function InvoiceFilterForm({
  filters,
  onChange,
}: {
  filters: InvoiceFilters;
  onChange: (filters: InvoiceFilters) => void;
}) {
  const clients = useClients();
  const form = useZodForm(filterForm, {
    mode: 'onChange',
    defaultValues: {
      status: filters.status ?? '',
      kind: filters.kind ?? '',
      clientId: filters.clientId ?? '',
      month: filters.month ?? '',
    } satisfies FilterValues,
  });
  const status = form.watch('status');
  const kind = form.watch('kind');
  const clientId = form.watch('clientId');
  const month = form.watch('month');

  useEffect(() => {
    const parsed = filterForm.safeParse({ status, kind, clientId, month });
    if (!parsed.success) return;
    // A tank chosen elsewhere (a link from its page) stays chosen; the form has no field for it.
    const next: InvoiceFilters = { ...parsed.data, tankId: filters.tankId };
    if (!sameInvoiceFilters(next, filters)) onChange(next);
  }, [status, kind, clientId, month, filters, onChange]);

  return (
    <Form
      form={form}
      role="search"
      aria-label="Find invoices"
      onSubmit={(values) => onChange({ ...values, tankId: filters.tankId })}
      className="grid items-end gap-3 rounded-card bg-white p-4 shadow-card sm:grid-cols-2 lg:grid-cols-4"
    >
      <SelectField<FilterValues>
        name="status"
        label="Status"
        options={[
          { value: '', label: 'Any status' },
          ...invoiceStatuses.map((one) => ({ value: one, label: invoiceStatusLabels[one] })),
        ]}
      />
      <SelectField<FilterValues>
        name="kind"
        label="Kind"
        options={[
          { value: '', label: 'Invoices and credit notes' },
          ...invoiceKinds.map((one) => ({ value: one, label: kindLabels[one] })),
        ]}
      />
      <SelectField<FilterValues>
        name="clientId"
        label="Client"
        disabled={clients.isPending}
        hint={clients.isError ? 'The client list could not be loaded.' : undefined}
        options={[
          { value: '', label: clients.isPending ? 'Loading clients…' : 'Every client' },
          // A client named in the address stays a choice while the list loads, so the select keeps it.
          ...(clients.data
            ? clients.data.map((client) => ({ value: client.id, label: client.name }))
            : filters.clientId
              ? [{ value: filters.clientId, label: 'The chosen client' }]
              : []),
        ]}
      />
      <TextField<FilterValues>
        name="month"
        label="Month issued"
        hint="Drafts by the month they were made."
        type="month"
        placeholder="YYYY-MM"
      />
    </Form>
  );
}

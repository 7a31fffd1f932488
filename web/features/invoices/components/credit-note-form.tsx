import { useId } from 'react';
import { formatMoney } from '@shared/billing/money';
import type { InvoiceDetail } from '@shared/schemas/billing';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { TextAreaField } from '../../../components/form-fields';
import { useCreateCreditNote } from '../api/create-credit-note';
import {
  creditNoteFormSchema,
  creditNoteFormValues,
  invoiceFieldFor,
  lineFormValues,
  type CreditNoteFormValues,
} from '../utils/invoice-form';
import { InvoiceLinesFields } from './invoice-lines-fields';

/**
 * A credit note against an issued invoice: why, and the lines to take back as positive amounts
 * (stored as negative ones). It starts with one empty line; the invoice's own lines are one tap away.
 */
export function CreditNoteForm({
  invoice,
  onMade,
  onCancel,
}: {
  invoice: InvoiceDetail;
  onMade: (creditNote: InvoiceDetail) => void;
  onCancel: () => void;
}) {
  const titleId = useId();
  const create = useCreateCreditNote(invoice.id);
  const form = useZodForm(creditNoteFormSchema(invoice.currency), { defaultValues: creditNoteFormValues() });
  const left = invoice.totalMinor - Math.abs(invoice.creditedMinor);
  const terms = {
    currency: invoice.currency,
    taxLabel: invoice.taxLabel,
    taxRateBp: invoice.taxRateBp,
    pricesIncludeTax: invoice.pricesIncludeTax,
  };
  return (
    <section aria-labelledby={titleId} className="min-w-0 rounded-card bg-white p-4 shadow-card sm:p-6">
      <h2 id={titleId} className="text-xl font-bold text-ink-900">
        Credit note
      </h2>
      <p className="mt-1 text-sm text-ink-700">
        Takes amounts back from {invoice.number ?? 'this invoice'} with a numbered document of its own. Type
        the amounts as positive numbers. Up to {formatMoney(left, invoice.currency)} is left to credit.
      </p>
      <Form
        form={form}
        fieldFor={invoiceFieldFor}
        aria-labelledby={titleId}
        className="mt-4 grid grid-cols-[minmax(0,1fr)] gap-4"
        onSubmit={async (values) => onMade(await create.mutateAsync(values))}
      >
        <TextAreaField<CreditNoteFormValues>
          name="reason"
          label="Why"
          hint="The client reads this on the credit note."
          rows={2}
          maxLength={500}
          required
        />
        <div>
          <Button
            tone="secondary"
            onClick={() =>
              form.setValue(
                'lines',
                invoice.lines.map((line) => lineFormValues(line, invoice.currency)),
                { shouldDirty: true },
              )
            }
          >
            Copy the invoice’s lines
          </Button>
        </div>
        <InvoiceLinesFields terms={terms} credit />
        <FormProblem />
        <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
          <Button tone="secondary" onClick={onCancel}>
            Close
          </Button>
          <SubmitButton pending="Making the credit note…">Make credit note</SubmitButton>
        </div>
      </Form>
    </section>
  );
}

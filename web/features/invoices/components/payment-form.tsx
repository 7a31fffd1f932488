import { useId } from 'react';
import { paymentMethodLabels, paymentMethods } from '@shared/billing/invoices';
import { formatMoney } from '@shared/billing/money';
import type { InvoiceDetail } from '@shared/schemas/billing';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { DecimalField, SelectField, TextField } from '../../../components/form-fields';
import { dayIn } from '../../../lib/format';
import { useRecordPayment } from '../api/record-payment';
import {
  invoiceFieldFor,
  paymentFormSchema,
  paymentFormValues,
  type PaymentFormValues,
} from '../utils/invoice-form';

// Online card payments are recorded by the provider's webhook, never by hand.
const methodOptions = paymentMethods
  .filter((method) => method !== 'card-online')
  .map((method) => ({ value: method, label: paymentMethodLabels[method] }));

/** Money received outside the provider: how, how much, on which day and its reference. */
export function PaymentForm({
  invoice,
  onRecorded,
  onCancel,
}: {
  invoice: InvoiceDetail;
  onRecorded: (invoice: InvoiceDetail) => void;
  onCancel: () => void;
}) {
  const titleId = useId();
  const record = useRecordPayment(invoice.id);
  const form = useZodForm(paymentFormSchema(invoice.currency), {
    defaultValues: paymentFormValues(invoice, dayIn(new Date())),
  });
  return (
    <section aria-labelledby={titleId} className="min-w-0 rounded-card bg-white p-4 shadow-card sm:p-6">
      <h2 id={titleId} className="text-xl font-bold text-ink-900">
        Record a payment
      </h2>
      <p className="mt-1 text-sm text-ink-700">
        Still owed: {formatMoney(invoice.balanceMinor, invoice.currency)}. Card payments made online are
        recorded by themselves.
      </p>
      <Form
        form={form}
        fieldFor={invoiceFieldFor}
        aria-labelledby={titleId}
        className="mt-4 grid gap-4 sm:grid-cols-2"
        onSubmit={async (values) => {
          const next = await record.mutateAsync(values);
          onRecorded(next);
        }}
      >
        <SelectField<PaymentFormValues> name="method" label="How it was paid" options={methodOptions} />
        <DecimalField<PaymentFormValues> name="amount" label="Amount" suffix={invoice.currency} />
        <TextField<PaymentFormValues> name="receivedOn" label="Received on" type="date" />
        <TextField<PaymentFormValues>
          name="reference"
          label="Reference (optional)"
          hint="The bank’s reference or a receipt number."
          maxLength={200}
        />
        <FormProblem className="sm:col-span-2" />
        <div className="flex flex-col-reverse gap-2 sm:col-span-2 sm:flex-row sm:justify-end">
          <Button tone="secondary" onClick={onCancel}>
            Close
          </Button>
          <SubmitButton pending="Recording…">Record payment</SubmitButton>
        </div>
      </Form>
    </section>
  );
}

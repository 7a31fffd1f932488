import { formatMoney } from '@shared/billing/money';
import { voidInvoiceInput, type InvoiceDetail } from '@shared/schemas/billing';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { TextAreaField } from '../../../components/form-fields';
import { SheetDialog } from '../../../components/sheet-dialog';
import { useVoidInvoice } from '../api/void-invoice';
import { documentTitle } from '../utils/invoice-text';

/**
 * The question before cancelling an invoice, with the reason the client will read. Cancelling
 * makes a credit note for the whole amount; it cannot be taken back.
 */
export function CancelInvoiceDialog({
  invoice,
  onCancelled,
  onClose,
}: {
  invoice: InvoiceDetail;
  onCancelled: (invoice: InvoiceDetail) => void;
  onClose: () => void;
}) {
  const cancel = useVoidInvoice(invoice.id);
  const form = useZodForm(voidInvoiceInput, { defaultValues: { reason: '' } });
  return (
    <SheetDialog title={`Cancel ${documentTitle(invoice)}?`} onClose={onClose}>
      <Form
        form={form}
        aria-label={`Cancel ${documentTitle(invoice)}`}
        className="grid gap-4"
        onSubmit={async ({ reason }) => onCancelled(await cancel.mutateAsync(reason))}
      >
        <p className="text-ink-700">
          A credit note for the whole {formatMoney(invoice.totalMinor, invoice.currency)} is made and{' '}
          {invoice.billToName || 'the client'} no longer owes it. This cannot be undone.
        </p>
        <TextAreaField
          name="reason"
          label="Why"
          hint="The client reads this."
          rows={3}
          maxLength={500}
          required
        />
        <FormProblem />
        <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
          <Button tone="secondary" onClick={onClose}>
            Keep the invoice
          </Button>
          <SubmitButton tone="danger" pending="Cancelling…">
            Cancel invoice
          </SubmitButton>
        </div>
      </Form>
    </SheetDialog>
  );
}

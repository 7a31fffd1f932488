import { useId, useState } from 'react';
import type { InvoiceDetail } from '@shared/schemas/billing';
import { Button } from '../../../components/button';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { SelectField, TextAreaField } from '../../../components/form-fields';
import { ApiError } from '../../../lib/api-client';
import { problemMessage } from '../../../lib/problem-message';
import { useDeleteInvoiceDraft } from '../api/delete-invoice-draft';
import { useIssueInvoice } from '../api/issue-invoice';
import { useSaveInvoiceDraft } from '../api/save-invoice-draft';
import {
  draftFormSchema,
  draftFormValues,
  invoiceFieldFor,
  type DraftFormValues,
} from '../utils/invoice-form';
import { InvoiceLinesFields } from './invoice-lines-fields';

const isConflict = (error: unknown, code: string) =>
  error instanceof ApiError && error.status === 409 && error.code === code;

/**
 * An admin's draft: whom it is addressed to, a note and the lines, with the totals previewed as
 * typed. Saving sends the version the edit started from, so two people editing cannot overwrite
 * each other silently; issuing numbers it and e-mails it to the owner, after a question naming them.
 */
export function DraftEditor({
  invoice,
  reload,
  onIssued,
  onDeleted,
  onGone,
}: {
  invoice: InvoiceDetail;
  /** Reads the draft again and answers with it (undefined when it could not). */
  reload: () => Promise<InvoiceDetail | undefined>;
  onIssued: (issued: InvoiceDetail) => void;
  onDeleted: () => void;
  /** Someone else issued or deleted the draft meanwhile. */
  onGone: () => void;
}) {
  const titleId = useId();
  const save = useSaveInvoiceDraft(invoice.id);
  const issue = useIssueInvoice(invoice.id);
  const remove = useDeleteInvoiceDraft(invoice.id);
  const form = useZodForm(draftFormSchema(invoice.currency), { defaultValues: draftFormValues(invoice) });
  const [stale, setStale] = useState(false);
  const [saved, setSaved] = useState(false);
  const [asking, setAsking] = useState<'issue' | 'delete' | null>(null);
  const [reloading, setReloading] = useState(false);
  const { isDirty } = form.formState;

  const loadTheirs = async () => {
    setReloading(true);
    const fresh = await reload();
    setReloading(false);
    if (!fresh) return;
    form.reset(draftFormValues(fresh));
    setStale(false);
  };

  const terms = {
    currency: invoice.currency,
    taxLabel: invoice.taxLabel,
    taxRateBp: invoice.taxRateBp,
    pricesIncludeTax: invoice.pricesIncludeTax,
  };
  const issueBlocked = isDirty
    ? 'Save your changes before issuing.'
    : invoice.billToUserId === null
      ? 'Choose whom it is addressed to, and save, before issuing.'
      : null;

  return (
    <section aria-labelledby={titleId} className="min-w-0 rounded-card bg-white p-4 shadow-card sm:p-6">
      <h2 id={titleId} className="text-xl font-bold text-ink-900">
        Edit the draft
      </h2>
      <p className="mt-1 text-sm text-ink-700">
        The client sees nothing until it is issued. Totals are worked out again by Brinewatch when you save.
      </p>
      {stale && (
        <div
          role="alert"
          className="mt-3 rounded-card border-2 border-watch-700 bg-watch-100 p-4 text-ink-950"
        >
          <p className="font-bold">
            Someone else saved this draft after you opened it; your changes are not saved.
          </p>
          <p className="mt-1">Load their version to carry on from it (what you typed here is replaced).</p>
          <Button className="mt-2" onClick={() => void loadTheirs()} disabled={reloading}>
            {reloading ? 'Loading…' : 'Load their version'}
          </Button>
        </div>
      )}
      <Form
        form={form}
        fieldFor={invoiceFieldFor}
        aria-labelledby={titleId}
        className="mt-4 grid grid-cols-[minmax(0,1fr)] gap-4"
        onChange={() => setSaved(false)}
        onSubmit={async (values) => {
          setSaved(false);
          try {
            const next = await save.mutateAsync(values);
            form.reset(draftFormValues(next));
            setSaved(true);
          } catch (error) {
            if (isConflict(error, 'stale_version')) {
              setStale(true);
              // The document under the editor shows what was saved, to compare before loading it.
              void reload();
              return;
            }
            if (isConflict(error, 'not_draft')) {
              onGone();
              return;
            }
            throw error;
          }
        }}
      >
        <SelectField<DraftFormValues>
          name="billToUserId"
          label="Bill to"
          hint={
            invoice.billToChoices.length === 0
              ? 'The tank has no owner with an account yet: add one on the tank before issuing.'
              : 'One of the tank’s owners; the invoice is e-mailed to them.'
          }
          options={[
            { value: '', label: 'Choose who pays' },
            ...invoice.billToChoices.map((choice) => ({
              value: choice.id,
              label: `${choice.name} (${choice.email})`,
            })),
          ]}
          className="sm:max-w-xl"
        />
        <TextAreaField<DraftFormValues>
          name="note"
          label="Note to the client (optional)"
          hint="Printed on the invoice."
          rows={2}
          maxLength={1000}
        />
        <InvoiceLinesFields terms={terms} />
        <FormProblem />
        <div className="flex flex-col gap-2 sm:flex-row sm:flex-wrap sm:items-center">
          <SubmitButton pending="Saving…">Save draft</SubmitButton>
          <Button
            tone="secondary"
            disabled={issueBlocked !== null}
            aria-describedby={issueBlocked ? `${titleId}-issue` : undefined}
            onClick={() => {
              issue.reset();
              setAsking('issue');
            }}
          >
            Issue and e-mail
          </Button>
          <Button
            tone="secondary"
            className="sm:ml-auto"
            onClick={() => {
              remove.reset();
              setAsking('delete');
            }}
          >
            Delete draft
          </Button>
        </div>
        <div role="status" className="text-sm">
          {saved && !isDirty && <p className="font-bold text-healthy-700">Draft saved.</p>}
          {issueBlocked && (
            <p id={`${titleId}-issue`} className="text-ink-700">
              {issueBlocked}
            </p>
          )}
        </div>
      </Form>

      <ConfirmDialog
        open={asking === 'issue'}
        title="Issue and e-mail this invoice?"
        confirmLabel="Issue and e-mail"
        pendingLabel="Issuing…"
        pending={issue.isPending}
        error={issue.isError ? problemMessage(issue.error) : undefined}
        onClose={() => setAsking(null)}
        onConfirm={() =>
          issue.mutate(invoice.version, {
            onSuccess: (issued) => {
              setAsking(null);
              onIssued(issued);
            },
          })
        }
      >
        <p>
          It gets the next invoice number and can no longer be changed (a credit note takes amounts back). It
          is e-mailed with its PDF to {invoice.billToName} at{' '}
          <strong className="break-all">{invoice.billToEmail}</strong>.
        </p>
      </ConfirmDialog>
      <ConfirmDialog
        open={asking === 'delete'}
        title="Delete this draft?"
        confirmLabel="Delete draft"
        cancelLabel="Keep it"
        pendingLabel="Deleting…"
        pending={remove.isPending}
        error={remove.isError ? problemMessage(remove.error) : undefined}
        onClose={() => setAsking(null)}
        onConfirm={() =>
          remove.mutate(undefined, {
            onSuccess: () => {
              setAsking(null);
              onDeleted();
            },
          })
        }
      >
        <p>The draft and its lines are removed. Nothing was sent to the client.</p>
      </ConfirmDialog>
    </section>
  );
}

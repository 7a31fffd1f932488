import { useState, type ReactNode } from 'react';
import { Link, useNavigate } from 'react-router';
import { Button } from '../../../components/button';
import { Page } from '../../../components/page';
import { ErrorState, LoadingState } from '../../../components/states';
import { can, useMe } from '../../../lib/auth';
import { useInvoice } from '../api/get-invoice';
import { invoiceActions } from '../utils/invoice-actions';
import { documentTitle } from '../utils/invoice-text';
import { CancelInvoiceDialog } from './cancel-invoice';
import { CreditNoteForm } from './credit-note-form';
import { DraftEditor } from './draft-editor';
import { InvoiceDocument, invoicePath } from './invoice-document';
import { PaymentForm } from './payment-form';
import { PdfLink } from './pdf-link';

const backClass =
  'inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50';

type Panel = 'payment' | 'credit-note' | 'cancel' | null;

function Notice({ children }: { children: ReactNode }) {
  return <div className="rounded-card bg-healthy-100 p-4 font-bold text-healthy-700">{children}</div>;
}

/**
 * One document for staff. Admins edit a draft, issue it or delete it; on an issued invoice they
 * record a payment, make a credit note or cancel it; a paid one takes a credit note only.
 * Technicians read it.
 */
export function StaffInvoiceDetail({ invoiceId }: { invoiceId: string }) {
  const navigate = useNavigate();
  const { data: me } = useMe();
  const isAdmin = can(me, 'invoices:manage');
  const invoice = useInvoice(invoiceId);
  const [panel, setPanel] = useState<Panel>(null);
  const [notice, setNotice] = useState<ReactNode>(null);

  const back = (
    <Link to="/console/invoices" className={backClass}>
      All invoices
    </Link>
  );
  if (invoice.isPending)
    return (
      <Page title="Invoice" actions={back}>
        <LoadingState label="Loading the invoice…" />
      </Page>
    );
  if (invoice.isError && !invoice.data)
    return (
      <Page title="Invoice" actions={back}>
        <ErrorState error={invoice.error} what="this invoice" onRetry={() => void invoice.refetch()} />
      </Page>
    );

  const data = invoice.data;
  const title = documentTitle(data);
  const actions = invoiceActions(data);
  const editing = isAdmin && data.status === 'draft';
  const toggle = (next: Panel) => {
    setNotice(null);
    setPanel((current) => (current === next ? null : next));
  };
  const done = (message: ReactNode) => {
    setPanel(null);
    setNotice(message);
  };

  return (
    <Page
      title={title}
      description={data.billToName ? `${data.billToName} · ${data.tank.name}` : data.tank.name}
      actions={
        <>
          {/* A draft's PDF is for admins, marked as a draft. */}
          {(data.status !== 'draft' || isAdmin) && <PdfLink invoiceId={data.id} />}
          {back}
        </>
      }
    >
      <title>{`${title} — Brinewatch`}</title>
      <div role="status" className={notice ? 'mb-4' : undefined}>
        {notice && <Notice>{notice}</Notice>}
      </div>
      <div className="grid grid-cols-[minmax(0,1fr)] gap-4">
        {editing && (
          <DraftEditor
            invoice={data}
            reload={async () => (await invoice.refetch()).data}
            onIssued={(issued) =>
              done(`${documentTitle(issued)} is issued and on its way to ${issued.billToEmail}.`)
            }
            onDeleted={() => void navigate('/console/invoices', { replace: true })}
            onGone={() => {
              void invoice.refetch();
              setNotice(
                'Someone else issued or deleted this draft meanwhile; the page now shows it as it is.',
              );
            }}
          />
        )}

        {isAdmin && (actions.recordPayment || actions.creditNote || actions.cancel) && (
          <section aria-label="What to do with this invoice" className="flex flex-wrap gap-2">
            {actions.recordPayment && (
              <Button
                tone={panel === 'payment' ? 'primary' : 'secondary'}
                aria-expanded={panel === 'payment'}
                onClick={() => toggle('payment')}
              >
                Record a payment
              </Button>
            )}
            {actions.creditNote && (
              <Button
                tone={panel === 'credit-note' ? 'primary' : 'secondary'}
                aria-expanded={panel === 'credit-note'}
                onClick={() => toggle('credit-note')}
              >
                Credit note
              </Button>
            )}
            {actions.cancel && (
              <Button tone="secondary" onClick={() => toggle('cancel')}>
                Cancel invoice
              </Button>
            )}
          </section>
        )}
        {isAdmin && actions.cancelRefused && (
          <p className="text-sm text-ink-700">
            Part of this invoice is paid or credited, so it cannot be cancelled: make a credit note for what
            is taken back.
          </p>
        )}

        {panel === 'payment' && actions.recordPayment && (
          <PaymentForm
            invoice={data}
            onCancel={() => setPanel(null)}
            onRecorded={(next) =>
              done(
                next.status === 'paid'
                  ? `Payment recorded: ${documentTitle(next)} is paid in full.`
                  : 'Payment recorded.',
              )
            }
          />
        )}
        {panel === 'credit-note' && actions.creditNote && (
          <CreditNoteForm
            invoice={data}
            onCancel={() => setPanel(null)}
            onMade={(creditNote) =>
              done(
                <>
                  <Link to={invoicePath('staff', creditNote.id)} className="text-brine-700">
                    {documentTitle(creditNote)}
                  </Link>{' '}
                  is made.
                </>,
              )
            }
          />
        )}
        {panel === 'cancel' && actions.cancel && (
          <CancelInvoiceDialog
            invoice={data}
            onClose={() => setPanel(null)}
            onCancelled={(cancelled) =>
              done(`${documentTitle(cancelled)} is cancelled; its credit note is listed below.`)
            }
          />
        )}

        <InvoiceDocument invoice={data} audience="staff" />
      </div>
    </Page>
  );
}

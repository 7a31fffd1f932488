import { useEffect, useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import { unpaidStatuses } from '@shared/billing/invoices';
import { formatMoney } from '@shared/billing/money';
import { FieldError } from '../../../components/field-error';
import { Page } from '../../../components/page';
import { ErrorState, LoadingState } from '../../../components/states';
import { useMe } from '../../../lib/auth';
import { useInvoice } from '../api/get-invoice';
import { documentDate, documentTitle } from '../utils/invoice-text';
import { confirmForMs, paymentWait, paymentWaitMessages, refetchEvery } from '../utils/payment-wait';
import { InvoiceDocument } from './invoice-document';
import { PayNow } from './pay-now';
import { PdfLink } from './pdf-link';

const backClass =
  'inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50';

const waitLooks = {
  confirming: 'bg-brine-100 text-brine-700',
  paid: 'bg-healthy-100 text-healthy-700',
  slow: 'bg-sand-100 text-ink-950',
} as const;

/**
 * One invoice or credit note for its owner: the document, its PDF and, while money is owed and the
 * company takes payments online, "Pay now". Back from the provider (`?paid=1`) the page says the
 * payment is being confirmed and reads the invoice again until the provider's word has arrived.
 */
export function OwnerInvoiceDetail({ invoiceId }: { invoiceId: string }) {
  const [params] = useSearchParams();
  const returned = params.get('paid') === '1';
  const { data: me } = useMe();
  const [waitedLong, setWaitedLong] = useState(false);
  const [refusal, setRefusal] = useState<string | null>(null);
  useEffect(() => {
    if (!returned) return;
    const timer = window.setTimeout(() => setWaitedLong(true), confirmForMs);
    return () => window.clearTimeout(timer);
  }, [returned]);
  const elapsed = waitedLong ? confirmForMs : 0;
  const invoice = useInvoice(invoiceId, {
    refetchEvery: (data) => refetchEvery(paymentWait(returned, data?.status, elapsed)),
  });
  const wait = paymentWait(returned, invoice.data?.status, elapsed);

  const back = (
    <Link to="/invoices" className={backClass}>
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
  const owed = data.kind === 'invoice' && unpaidStatuses.includes(data.status);
  // Once back from paying, "Pay now" stays away: the money is on its way, and paying twice is the worse mistake.
  const canPay = data.payable && wait === 'none';
  return (
    <Page
      title={title}
      description={`For ${data.tank.name}`}
      actions={
        <>
          <PdfLink invoiceId={data.id} />
          {back}
        </>
      }
    >
      <title>{`${title} — Brinewatch`}</title>
      <div role="alert" className={refusal ? 'mb-4' : undefined}>
        {refusal && <FieldError className="">{refusal}</FieldError>}
      </div>
      <div className="grid grid-cols-[minmax(0,1fr)] gap-4">
        {/* Always in the page while back from paying, so each change of its words is read out. */}
        {wait !== 'none' && (
          <div role="status" className={`rounded-card p-4 font-bold ${waitLooks[wait]}`}>
            {paymentWaitMessages[wait]}
          </div>
        )}
        {canPay && (
          <section
            aria-label="Pay this invoice"
            className="flex flex-wrap items-center justify-between gap-3 rounded-card bg-white p-4 shadow-card"
          >
            <p className="text-ink-950">
              <strong>{formatMoney(data.balanceMinor, data.currency)}</strong> is due
              {data.dueDate ? ` by ${documentDate(data.dueDate)}` : ''}. Pay by card on the payment provider’s
              secure page.
            </p>
            <PayNow
              invoice={data}
              onRefused={(message) => {
                setRefusal(message);
                void invoice.refetch();
              }}
            />
          </section>
        )}
        {owed && !data.payable && wait === 'none' && (
          <p className="rounded-card bg-sand-100 p-4 text-ink-950">
            This invoice cannot be paid online. Pay it as agreed with{' '}
            {me?.company.name ?? 'your maintenance company'}; the details are on the invoice.
          </p>
        )}
        <InvoiceDocument invoice={data} audience="owner" />
      </div>
    </Page>
  );
}

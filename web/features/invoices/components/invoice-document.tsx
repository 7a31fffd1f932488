import { useId, type ReactNode } from 'react';
import { Link } from 'react-router';
import { invoiceLineKindLabels, paymentMethodLabels } from '@shared/billing/invoices';
import { formatMoney, quantityToText } from '@shared/billing/money';
import type { InvoiceDetail, InvoiceLineView } from '@shared/schemas/billing';
import { documentDate, documentTitle, taxLine } from '../utils/invoice-text';
import { InvoiceStatusBadge } from './invoice-status-badge';

/** Who reads the document: links go to the owner's pages or to the console's. */
export type InvoiceAudience = 'owner' | 'staff';

export const invoicePath = (audience: InvoiceAudience, invoiceId: string) =>
  audience === 'owner' ? `/invoices/${invoiceId}` : `/console/invoices/${invoiceId}`;

const linkClass = 'font-bold text-brine-700';

function Fact({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="min-w-0">
      <dt className="text-sm font-bold text-ink-700">{term}</dt>
      <dd className="mt-0.5 break-words text-ink-950">{children}</dd>
    </div>
  );
}

function sourceLink(invoice: InvoiceDetail, audience: InvoiceAudience): string | null {
  const source = invoice.source;
  if (!source) return null;
  if (source.kind === 'urgent') return `/urgent/${source.id}`;
  // Staff open the report itself; owners read published reports on the tank's page.
  return audience === 'staff'
    ? `/visits/${source.id}`
    : `/tanks/${invoice.tank.id}?section=visits&visit=${source.id}`;
}

const quantityText = (line: InvoiceLineView) => quantityToText(line.quantityHundredths);

/**
 * The lines: a table on a wide screen; on a phone each line is its own stacked row, so nothing
 * scrolls sideways.
 */
function Lines({ invoice }: { invoice: InvoiceDetail }) {
  const money = (minor: number) => formatMoney(minor, invoice.currency);
  if (invoice.lines.length === 0) return <p className="text-ink-700">No lines yet.</p>;
  return (
    <>
      <ul className="divide-y divide-ink-100 border-y border-ink-100 md:hidden">
        {invoice.lines.map((line) => (
          <li key={line.id} className="grid grid-cols-[minmax(0,1fr)_auto] gap-x-3 gap-y-0.5 py-3">
            <p className="font-bold break-words text-ink-950">{line.description}</p>
            <p className="text-right font-bold text-ink-950 tabular-nums">{money(line.amountMinor)}</p>
            <p className="text-sm text-ink-700">
              {invoiceLineKindLabels[line.kind]} · {quantityText(line)}
              {line.unit ? ` ${line.unit}` : ''} × {money(line.unitPriceMinor)}
            </p>
          </li>
        ))}
      </ul>
      <table className="hidden w-full text-left md:table">
        <caption className="sr-only">Lines of {documentTitle(invoice)}</caption>
        <thead className="border-b-2 border-ink-100 text-sm text-ink-700">
          <tr>
            <th scope="col" className="py-2 pr-4 font-bold">
              Description
            </th>
            <th scope="col" className="px-3 py-2 text-right font-bold">
              Quantity
            </th>
            <th scope="col" className="px-3 py-2 font-bold">
              Unit
            </th>
            <th scope="col" className="px-3 py-2 text-right font-bold">
              Unit price
            </th>
            <th scope="col" className="py-2 pl-3 text-right font-bold">
              Amount
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-100">
          {invoice.lines.map((line) => (
            <tr key={line.id} className="align-top">
              <td className="py-2 pr-4">
                <p className="break-words text-ink-950">{line.description}</p>
                <p className="text-sm text-ink-700">{invoiceLineKindLabels[line.kind]}</p>
              </td>
              <td className="px-3 py-2 text-right tabular-nums">{quantityText(line)}</td>
              <td className="px-3 py-2">{line.unit || '—'}</td>
              <td className="px-3 py-2 text-right tabular-nums">{money(line.unitPriceMinor)}</td>
              <td className="py-2 pl-3 text-right tabular-nums">{money(line.amountMinor)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}

function Sum({ term, children, strong = false }: { term: ReactNode; children: ReactNode; strong?: boolean }) {
  return (
    <div
      className={`flex justify-between gap-4 py-1 ${strong ? 'border-t-2 border-ink-100 pt-2 text-lg font-bold' : ''}`}
    >
      <dt className={strong ? 'text-ink-950' : 'text-ink-700'}>{term}</dt>
      <dd className="text-ink-950 tabular-nums">{children}</dd>
    </div>
  );
}

/** Net, tax, total; for an issued invoice what was paid and credited, and what is still owed. */
function Totals({ invoice }: { invoice: InvoiceDetail }) {
  const money = (minor: number) => formatMoney(minor, invoice.currency);
  const owed = invoice.kind === 'invoice' && invoice.status !== 'draft';
  return (
    <div className="ml-auto w-full max-w-sm">
      <dl>
        <Sum term={invoice.pricesIncludeTax ? 'Net (before tax)' : 'Net'}>{money(invoice.netMinor)}</Sum>
        <Sum term={taxLine(invoice.taxLabel, invoice.taxRateBp)}>{money(invoice.taxMinor)}</Sum>
        <Sum term="Total" strong>
          {money(invoice.totalMinor)}
        </Sum>
        {owed && invoice.paidMinor !== 0 && <Sum term="Paid">{money(-invoice.paidMinor)}</Sum>}
        {owed && invoice.creditedMinor !== 0 && (
          <Sum term="Credited">{money(-Math.abs(invoice.creditedMinor))}</Sum>
        )}
        {owed && (
          <Sum term="Balance due" strong>
            {money(invoice.balanceMinor)}
          </Sum>
        )}
      </dl>
      {invoice.pricesIncludeTax && (
        <p className="mt-1 text-right text-sm text-ink-700">
          Prices include {taxLine(invoice.taxLabel, invoice.taxRateBp)}.
        </p>
      )}
    </div>
  );
}

function Part({ title, children }: { title: string; children: ReactNode }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className="min-w-0">
      <h3 id={id} className="font-bold text-ink-900">
        {title}
      </h3>
      <div className="mt-1">{children}</div>
    </section>
  );
}

function Payments({ invoice }: { invoice: InvoiceDetail }) {
  if (invoice.payments.length === 0) return <p className="text-ink-700">No payments yet.</p>;
  return (
    <ul className="divide-y divide-ink-100">
      {invoice.payments.map((payment) => (
        <li key={payment.id} className="flex flex-wrap justify-between gap-x-4 py-2">
          <span className="min-w-0">
            {documentDate(payment.receivedAt, invoice.timeZone)} · {paymentMethodLabels[payment.method]}
            {payment.reference && <span className="break-words text-ink-700"> · {payment.reference}</span>}
          </span>
          <span className="font-bold tabular-nums">{formatMoney(payment.amountMinor, payment.currency)}</span>
        </li>
      ))}
    </ul>
  );
}

/** Credit notes against an invoice, or the invoice a credit note credits. */
function Related({ invoice, audience }: { invoice: InvoiceDetail; audience: InvoiceAudience }) {
  return (
    <ul className="grid gap-1">
      {invoice.related.map((doc) => (
        <li key={doc.id} className="flex flex-wrap justify-between gap-x-4">
          <Link
            to={invoicePath(audience, doc.id)}
            className={`${linkClass} inline-flex min-h-11 items-center`}
          >
            {documentTitle(doc)}
          </Link>
          <span className="inline-flex min-h-11 items-center gap-2 text-ink-700">
            {doc.issueDate && <span>{documentDate(doc.issueDate)}</span>}
            <span className="font-bold text-ink-950 tabular-nums">
              {formatMoney(doc.totalMinor, invoice.currency)}
            </span>
          </span>
        </li>
      ))}
    </ul>
  );
}

/**
 * An invoice or credit note as a document people can read and check: who sells and who pays, the
 * tank, the lines, the totals with the tax named, payments, related documents and what is still owed.
 */
export function InvoiceDocument({
  invoice,
  audience,
}: {
  invoice: InvoiceDetail;
  audience: InvoiceAudience;
}) {
  const titleId = useId();
  const source = sourceLink(invoice, audience);
  const isInvoice = invoice.kind === 'invoice';
  return (
    <article aria-labelledby={titleId} className="min-w-0 rounded-card bg-white p-4 shadow-card sm:p-8">
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 id={titleId} className="text-xl font-bold text-ink-900 sm:text-2xl">
            {documentTitle(invoice)}
          </h2>
          {invoice.status === 'draft' && (
            <p className="text-sm text-ink-700">Not issued yet: the number is given when it is issued.</p>
          )}
        </div>
        <InvoiceStatusBadge kind={invoice.kind} status={invoice.status} size="lg" />
      </header>

      <dl className="mt-5 grid grid-cols-2 gap-x-4 gap-y-3 sm:grid-cols-4">
        <Fact term="Issued">{documentDate(invoice.issueDate, invoice.timeZone)}</Fact>
        {isInvoice && <Fact term="Due">{documentDate(invoice.dueDate, invoice.timeZone)}</Fact>}
        {invoice.paidAt && <Fact term="Paid">{documentDate(invoice.paidAt, invoice.timeZone)}</Fact>}
        <Fact term="Tank">
          <Link to={`/tanks/${invoice.tank.id}`} className={linkClass}>
            {invoice.tank.name}
          </Link>
        </Fact>
        {invoice.source && source && (
          <Fact term={invoice.source.kind === 'urgent' ? 'Urgent visit' : 'Service visit'}>
            <Link to={source} className={linkClass}>
              {invoice.source.label}
            </Link>
          </Fact>
        )}
      </dl>

      <div className="mt-6 grid gap-4 sm:grid-cols-2">
        <Part title="From">
          {invoice.seller ? (
            <>
              <p className="font-bold break-words">{invoice.seller.name}</p>
              {invoice.seller.address && (
                <p className="break-words whitespace-pre-line text-ink-950">{invoice.seller.address}</p>
              )}
              {invoice.seller.taxId && (
                <p className="text-ink-700">
                  {invoice.taxLabel} number: <span className="break-all">{invoice.seller.taxId}</span>
                </p>
              )}
            </>
          ) : (
            <p className="text-ink-700">The company’s details are added when it is issued.</p>
          )}
        </Part>
        <Part title="Bill to">
          {invoice.billToName ? (
            <>
              <p className="font-bold break-words">{invoice.billToName}</p>
              {invoice.billToEmail && <p className="break-all text-ink-700">{invoice.billToEmail}</p>}
            </>
          ) : (
            <p className="text-ink-700">Nobody chosen yet.</p>
          )}
        </Part>
      </div>

      {invoice.reason && (
        <p className="mt-5 rounded-lg bg-sand-100 p-3 break-words">
          <span className="font-bold">
            {invoice.status === 'void' ? 'Why it was cancelled: ' : 'Reason: '}
          </span>
          {invoice.reason}
        </p>
      )}

      <div className="mt-6">
        <h3 className="sr-only">Lines</h3>
        <Lines invoice={invoice} />
      </div>

      <div className="mt-4">
        <Totals invoice={invoice} />
      </div>

      {invoice.note && (
        <div className="mt-6">
          <Part title="Note">
            <p className="break-words whitespace-pre-line">{invoice.note}</p>
          </Part>
        </div>
      )}

      {isInvoice && invoice.status !== 'draft' && (
        <div className="mt-6">
          <Part title="Payments">
            <Payments invoice={invoice} />
          </Part>
        </div>
      )}

      {invoice.related.length > 0 && (
        <div className="mt-6">
          <Part title={isInvoice ? 'Credit notes' : 'Credits'}>
            <Related invoice={invoice} audience={audience} />
          </Part>
        </div>
      )}

      {invoice.seller?.footer && (
        <p className="mt-8 border-t border-ink-100 pt-4 text-sm break-words whitespace-pre-line text-ink-700">
          {invoice.seller.footer}
        </p>
      )}
    </article>
  );
}

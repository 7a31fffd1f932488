import { Link } from 'react-router';
import { formatMoney } from '@shared/billing/money';
import type { InvoiceSummary } from '@shared/schemas/billing';
import { documentDate, documentTitle } from '../utils/invoice-text';
import { invoicePath, type InvoiceAudience } from './invoice-document';
import { InvoiceStatusBadge } from './invoice-status-badge';

const linkClass = 'inline-flex min-h-11 items-center font-bold text-brine-700';

/** Only an invoice is owed or due; a draft or a credit note says so with a dash. */
const owes = (item: InvoiceSummary) => item.kind === 'invoice' && item.status !== 'draft';

/**
 * Invoices and credit notes, newest first: cards on a phone, a table on a desk. Staff also see
 * whom each is addressed to.
 */
export function InvoiceTable({
  items,
  audience,
}: {
  items: readonly InvoiceSummary[];
  audience: InvoiceAudience;
}) {
  const money = (item: InvoiceSummary, minor: number) => formatMoney(minor, item.currency);
  const staff = audience === 'staff';
  return (
    <>
      <ul className="space-y-3 md:hidden">
        {items.map((item) => (
          <li key={item.id} className="rounded-card bg-white p-3 shadow-card">
            <div className="flex flex-wrap items-start justify-between gap-2">
              <Link to={invoicePath(audience, item.id)} className={`${linkClass} text-lg leading-snug`}>
                {documentTitle(item)}
              </Link>
              <InvoiceStatusBadge kind={item.kind} status={item.status} />
            </div>
            <dl className="mt-1 grid grid-cols-[auto_minmax(0,1fr)] gap-x-2 text-sm">
              {staff && (
                <>
                  <dt className="font-bold text-ink-700">Client:</dt>
                  <dd className="break-words text-ink-950">{item.billToName || 'nobody chosen yet'}</dd>
                </>
              )}
              <dt className="font-bold text-ink-700">Tank:</dt>
              <dd className="break-words text-ink-950">{item.tank.name}</dd>
              <dt className="font-bold text-ink-700">Total:</dt>
              <dd className="text-ink-950 tabular-nums">{money(item, item.totalMinor)}</dd>
              {owes(item) && (
                <>
                  <dt className="font-bold text-ink-700">Balance due:</dt>
                  <dd className="text-ink-950 tabular-nums">{money(item, item.balanceMinor)}</dd>
                  <dt className="font-bold text-ink-700">Due:</dt>
                  <dd className="text-ink-950">{documentDate(item.dueDate)}</dd>
                </>
              )}
              {!owes(item) && item.issueDate && (
                <>
                  <dt className="font-bold text-ink-700">Issued:</dt>
                  <dd className="text-ink-950">{documentDate(item.issueDate)}</dd>
                </>
              )}
            </dl>
          </li>
        ))}
      </ul>
      <div className="hidden overflow-hidden rounded-card bg-white shadow-card md:block">
        <table className="w-full text-left">
          <caption className="sr-only">Invoices and credit notes, newest first</caption>
          <thead className="bg-ink-50 text-sm text-ink-700">
            <tr>
              <th scope="col" className="px-4 py-3 font-bold">
                Document
              </th>
              <th scope="col" className="px-4 py-3 font-bold">
                {staff ? 'Client and tank' : 'Tank'}
              </th>
              <th scope="col" className="px-4 py-3 font-bold">
                Status
              </th>
              <th scope="col" className="px-4 py-3 font-bold">
                Due
              </th>
              <th scope="col" className="px-4 py-3 text-right font-bold">
                Total
              </th>
              <th scope="col" className="px-4 py-3 text-right font-bold">
                Balance due
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-ink-100">
            {items.map((item) => (
              <tr key={item.id} className="align-top">
                <td className="px-4 py-2">
                  <Link to={invoicePath(audience, item.id)} className={linkClass}>
                    {documentTitle(item)}
                  </Link>
                  <p className="text-sm text-ink-700">
                    {item.issueDate
                      ? `Issued ${documentDate(item.issueDate)}`
                      : `Made ${documentDate(item.createdAt)}`}
                  </p>
                </td>
                <td className="px-4 py-3 text-sm">
                  {staff && (
                    <p className="font-bold text-ink-950">{item.billToName || 'Nobody chosen yet'}</p>
                  )}
                  <p className={staff ? 'text-ink-700' : 'text-ink-950'}>{item.tank.name}</p>
                </td>
                <td className="px-4 py-3">
                  <InvoiceStatusBadge kind={item.kind} status={item.status} />
                </td>
                <td className="px-4 py-3 text-sm whitespace-nowrap">
                  {owes(item) ? documentDate(item.dueDate) : '—'}
                </td>
                <td className="px-4 py-3 text-right whitespace-nowrap tabular-nums">
                  {money(item, item.totalMinor)}
                </td>
                <td className="px-4 py-3 text-right font-bold whitespace-nowrap tabular-nums">
                  {owes(item) ? money(item, item.balanceMinor) : '—'}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}

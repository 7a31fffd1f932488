import { useId } from 'react';
import { formatMoney } from '@shared/billing/money';
import type { InvoiceTotalsRow } from '@shared/schemas/billing';
import { formatCount } from '../../../lib/format';

function Figure({ term, children }: { term: string; children: string }) {
  return (
    <div className="min-w-0">
      <dt className="text-sm font-bold text-ink-700">{term}</dt>
      <dd className="text-lg font-bold text-ink-950 tabular-nums">{children}</dd>
    </div>
  );
}

/** What the filters match in all (not only the pages shown), one row per currency. */
export function InvoiceTotalsPanel({ totals }: { totals: readonly InvoiceTotalsRow[] }) {
  const id = useId();
  if (totals.length === 0) return null;
  return (
    <section aria-labelledby={id} className="rounded-card bg-white p-4 shadow-card">
      <h2 id={id} className="font-bold text-ink-900">
        Totals for these filters
      </h2>
      <div className="mt-2 grid gap-3">
        {totals.map((row) => {
          const money = (minor: number) => formatMoney(minor, row.currency);
          return (
            <dl
              key={row.currency}
              className="grid grid-cols-2 gap-3 sm:grid-cols-4"
              aria-label={row.currency}
            >
              <Figure term="Documents">{`${formatCount(row.count)} in ${row.currency}`}</Figure>
              <Figure term="Total">{money(row.totalMinor)}</Figure>
              <Figure term="Paid">{money(row.paidMinor)}</Figure>
              <Figure term="Balance due">{money(row.balanceMinor)}</Figure>
            </dl>
          );
        })}
      </div>
    </section>
  );
}

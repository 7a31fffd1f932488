import { describe, expect, it } from 'vitest';
import type { InvoicePage, InvoiceSummary } from '@shared/schemas/billing';
import { invoiceSearch, mergeInvoicePages } from '../../../../web/features/invoices/api/list-invoices';
import {
  narrowsInvoices,
  readInvoiceAddress,
  sameInvoiceFilters,
} from '../../../../web/features/invoices/utils/invoice-address';

const client = '5c1a3d2e-8f4b-4a6c-9d7e-1b2c3d4e5f60';
const id = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;

function summary(n: number): InvoiceSummary {
  return {
    id: id(n),
    kind: 'invoice',
    status: 'issued',
    number: `INV-${String(n).padStart(6, '0')}`,
    tank: { id: id(900), name: 'Lounge reef' },
    billToName: 'Ada Example',
    currency: 'GBP',
    totalMinor: 5400,
    balanceMinor: 5400,
    issueDate: '2026-12-01',
    dueDate: '2026-12-15',
    createdAt: '2026-12-01T09:00:00.000Z',
  };
}

const totals = (count: number) => [
  { currency: 'GBP', count, totalMinor: 5400 * count, paidMinor: 0, balanceMinor: 5400 * count },
];

describe('the staff list’s address', () => {
  it('reads the filters it can and drops what it cannot', () => {
    const params = new URLSearchParams(
      `status=overdue&kind=credit-note&clientId=${client}&month=2026-11&tankId=not-an-id&after=xyz`,
    );
    expect(readInvoiceAddress(params)).toEqual({
      status: 'overdue',
      kind: 'credit-note',
      clientId: client,
      month: '2026-11',
    });
    expect(readInvoiceAddress(new URLSearchParams('status=unpaid&month=2026-13&kind='))).toEqual({});
  });

  it('writes the same filters back in one order, so one choice is one address', () => {
    const filters = { month: '2026-11', clientId: client, status: 'paid' as const };
    expect(invoiceSearch(filters).toString()).toBe(`status=paid&clientId=${client}&month=2026-11`);
    expect(readInvoiceAddress(invoiceSearch(filters))).toEqual(filters);
    expect(invoiceSearch({}, 'cursor-2').toString()).toBe('after=cursor-2');
  });

  it('tells a narrowed list from the whole one, and equal filters apart from different ones', () => {
    expect(narrowsInvoices({})).toBe(false);
    expect(narrowsInvoices({ month: '2026-11' })).toBe(true);
    expect(sameInvoiceFilters({ status: 'paid' }, { status: 'paid', kind: undefined })).toBe(true);
    expect(sameInvoiceFilters({ status: 'paid' }, { status: 'issued' })).toBe(false);
  });
});

describe('the pages of a list', () => {
  it('shows a document seen on two pages once, with the newest page’s totals', () => {
    const pages: InvoicePage[] = [
      { items: [summary(3), summary(2)], nextCursor: 'c1', totals: totals(3) },
      { items: [summary(2), summary(1)], nextCursor: null, totals: totals(4) },
    ];
    const list = mergeInvoicePages({ pages, pageParams: [undefined, 'c1'] });
    expect(list.items.map((item) => item.id)).toEqual([id(3), id(2), id(1)]);
    expect(list.totals).toEqual(totals(4));
    expect(list.complete).toBe(true);
  });

  it('is not complete while a page is left', () => {
    const list = mergeInvoicePages({
      pages: [{ items: [summary(1)], nextCursor: 'c1', totals: totals(9) }],
      pageParams: [undefined],
    });
    expect(list.complete).toBe(false);
  });
});

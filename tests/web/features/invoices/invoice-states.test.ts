import { describe, expect, it } from 'vitest';
import { invoiceActions } from '../../../../web/features/invoices/utils/invoice-actions';
import {
  documentDate,
  documentTitle,
  statusLabel,
  taxLine,
} from '../../../../web/features/invoices/utils/invoice-text';
import {
  confirmEveryMs,
  confirmForMs,
  paymentWait,
  paymentWaitMessages,
  refetchEvery,
} from '../../../../web/features/invoices/utils/payment-wait';

describe('back from the payment provider', () => {
  it('asks again every two seconds until the invoice is paid', () => {
    expect(paymentWait(true, 'issued', 0)).toBe('confirming');
    expect(refetchEvery('confirming')).toBe(confirmEveryMs);
    expect(confirmEveryMs).toBe(2_000);
    expect(paymentWait(true, 'paid', 0)).toBe('paid');
    expect(refetchEvery('paid')).toBe(false);
  });

  it('stops asking after two minutes and says so calmly', () => {
    expect(confirmForMs).toBe(120_000);
    expect(paymentWait(true, 'overdue', confirmForMs)).toBe('slow');
    expect(refetchEvery('slow')).toBe(false);
    expect(paymentWaitMessages.slow).toContain('no need to pay again');
    // Paid wins over slow: the provider's word may arrive just as the page stops asking.
    expect(paymentWait(true, 'paid', confirmForMs)).toBe('paid');
  });

  it('does nothing for someone who did not just pay', () => {
    expect(paymentWait(false, 'issued', 0)).toBe('none');
    expect(refetchEvery('none')).toBe(false);
  });
});

describe('what an admin can do with a document', () => {
  const none = { recordPayment: false, creditNote: false, cancel: false, cancelRefused: false };
  const money = { paidMinor: 0, creditedMinor: 0 };

  it('takes a payment, a credit note or a cancellation while an invoice is owed', () => {
    for (const status of ['issued', 'overdue'] as const) {
      expect(invoiceActions({ kind: 'invoice', status, ...money })).toEqual({
        recordPayment: true,
        creditNote: true,
        cancel: true,
        cancelRefused: false,
      });
    }
  });

  it('no longer cancels once part is paid or credited', () => {
    expect(
      invoiceActions({ kind: 'invoice', status: 'issued', paidMinor: 1000, creditedMinor: 0 }),
    ).toMatchObject({
      cancel: false,
      cancelRefused: true,
      creditNote: true,
    });
    expect(
      invoiceActions({ kind: 'invoice', status: 'overdue', paidMinor: 0, creditedMinor: -500 }).cancel,
    ).toBe(false);
  });

  it('takes only a credit note once paid, and nothing when cancelled or on a credit note', () => {
    expect(invoiceActions({ kind: 'invoice', status: 'paid', ...money })).toEqual({
      ...none,
      creditNote: true,
    });
    expect(invoiceActions({ kind: 'invoice', status: 'void', ...money })).toEqual(none);
    expect(invoiceActions({ kind: 'invoice', status: 'draft', ...money })).toEqual(none);
    expect(invoiceActions({ kind: 'credit-note', status: 'issued', ...money })).toEqual(none);
  });
});

describe('the words on a document', () => {
  it('names it by kind and number, or as a draft', () => {
    expect(documentTitle({ kind: 'invoice', number: 'INV-000042' })).toBe('Invoice INV-000042');
    expect(documentTitle({ kind: 'credit-note', number: 'CN-000007' })).toBe('Credit note CN-000007');
    expect(documentTitle({ kind: 'invoice', number: null })).toBe('Draft invoice');
  });

  it('never says a credit note awaits payment', () => {
    expect(statusLabel('invoice', 'issued')).toBe('Awaiting payment');
    expect(statusLabel('credit-note', 'issued')).toBe('Issued');
    expect(statusLabel('credit-note', 'void')).toBe('Cancelled');
  });

  it('names the tax with its rate', () => {
    expect(taxLine('VAT', 2000)).toBe('VAT 20 %');
    expect(taxLine('GST', 810)).toBe('GST 8.1 %');
  });

  it('reads a calendar day as that day, whatever the zone', () => {
    expect(documentDate('2026-12-01')).toBe('1 Dec 2026');
    expect(documentDate(null)).toBe('—');
  });

  it('reads a moment as its date in the tank’s zone', () => {
    expect(documentDate('2026-12-01T23:30:00.000Z', 'Pacific/Auckland')).toBe('2 Dec 2026');
    expect(documentDate('2026-12-01T23:30:00.000Z', 'Europe/London')).toBe('1 Dec 2026');
  });
});

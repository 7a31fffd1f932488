import { describe, expect, it } from 'vitest';
import type { InvoiceDetail, InvoiceLineView } from '@shared/schemas/billing';
import {
  blankLine,
  creditNoteFormSchema,
  draftFormSchema,
  draftFormValues,
  invoiceFieldFor,
  lineFormValues,
  paymentFormSchema,
  paymentFormValues,
  previewTotals,
  type LineFormValues,
} from '../../../../web/features/invoices/utils/invoice-form';

const ownerId = '5c1a3d2e-8f4b-4a6c-9d7e-1b2c3d4e5f60';
const lineId = '7e2b1c4d-3a5f-4b6e-8c9d-0a1b2c3d4e5f';

function line(changes: Partial<InvoiceLineView> = {}): InvoiceLineView {
  return {
    id: lineId,
    kind: 'service',
    description: 'Routine service, up to 300 L',
    quantityHundredths: 100,
    unit: 'visit',
    unitPriceMinor: 4500,
    amountMinor: 4500,
    priceItemId: null,
    ...changes,
  };
}

function draft(changes: Partial<InvoiceDetail> = {}): InvoiceDetail {
  return {
    id: '1f2e3d4c-5b6a-4789-8abc-def012345678',
    kind: 'invoice',
    status: 'draft',
    number: null,
    tank: { id: '2a3b4c5d-6e7f-4801-9234-56789abcdef0', name: 'Lounge reef' },
    billToName: '',
    currency: 'GBP',
    totalMinor: 5400,
    balanceMinor: 0,
    issueDate: null,
    dueDate: null,
    createdAt: '2026-12-01T09:00:00.000Z',
    version: 3,
    timeZone: 'Europe/London',
    billToUserId: null,
    billToEmail: '',
    taxRateBp: 2000,
    taxLabel: 'VAT',
    pricesIncludeTax: false,
    netMinor: 4500,
    taxMinor: 900,
    paidMinor: 0,
    creditedMinor: 0,
    note: '',
    reason: null,
    paidAt: null,
    lines: [line()],
    payments: [],
    related: [],
    source: null,
    seller: null,
    billToChoices: [],
    payable: false,
    ...changes,
  };
}

const filledLine = (changes: Partial<LineFormValues> = {}): LineFormValues => ({
  ...blankLine(),
  description: 'Filter floss',
  quantity: '2',
  unit: 'bag',
  unitPrice: '3.50',
  ...changes,
});

/** Every message by field; a field with two messages fails the test (the form would show only one). */
function issuesOf(result: { error?: { issues: { path: PropertyKey[]; message: string }[] } }) {
  const byField: Record<string, string> = {};
  for (const issue of result.error?.issues ?? []) {
    const field = issue.path.join('.');
    expect(byField, `two messages for ${field}`).not.toHaveProperty(field);
    byField[field] = issue.message;
  }
  return byField;
}

describe('the draft form', () => {
  it('starts from the saved draft, prices as text in the major unit', () => {
    const values = draftFormValues(draft({ billToUserId: ownerId, note: 'Thanks!' }));
    expect(values).toEqual({
      version: 3,
      billToUserId: ownerId,
      note: 'Thanks!',
      lines: [
        {
          kind: 'service',
          description: 'Routine service, up to 300 L',
          quantity: '1',
          unit: 'visit',
          unitPrice: '45.00',
          priceItemId: null,
        },
      ],
    });
  });

  it('gives a draft made without lines one line to fill in', () => {
    expect(draftFormValues(draft({ lines: [] })).lines).toEqual([blankLine()]);
  });

  it('sends what PUT /api/invoices/:id takes: nobody chosen is null, the version is kept', () => {
    const input = draftFormSchema('GBP').parse({
      version: 3,
      billToUserId: '',
      note: '',
      lines: [filledLine({ quantity: '1,5', unitPrice: '12,50' })],
    });
    expect(input.billToUserId).toBeNull();
    expect(input.version).toBe(3);
    expect(input.lines[0]).toMatchObject({ quantity: '1,5', unitPrice: '12,50', priceItemId: null });
  });

  it('refuses decimals in a currency without a minor unit, under the line’s price', () => {
    const result = draftFormSchema('JPY').safeParse({
      version: 1,
      billToUserId: ownerId,
      note: '',
      lines: [filledLine({ unitPrice: '1200' }), filledLine({ unitPrice: '12.50' })],
    });
    expect(issuesOf(result)).toEqual({ 'lines.1.unitPrice': 'JPY has no decimals.' });
  });

  it('says what is wrong with a line in the shared schema’s words', () => {
    const result = draftFormSchema('GBP').safeParse({
      version: 1,
      billToUserId: ownerId,
      note: '',
      lines: [filledLine({ description: ' ', quantity: '0', unitPrice: '-3' })],
    });
    expect(issuesOf(result)).toEqual({
      'lines.0.description': 'Describe the line.',
      'lines.0.quantity': 'The quantity is more than 0.',
      'lines.0.unitPrice': 'Use an amount such as 12.50 (at most two decimals, not negative).',
    });
  });
});

describe('the credit note form', () => {
  it('types a credit note’s stored negative amounts back as positive ones', () => {
    expect(lineFormValues(line({ unitPriceMinor: -4500, amountMinor: -4500 }), 'GBP').unitPrice).toBe(
      '45.00',
    );
  });

  it('asks why', () => {
    const result = creditNoteFormSchema('GBP').safeParse({ reason: '', lines: [filledLine()] });
    expect(issuesOf(result)).toEqual({ reason: 'Say why.' });
  });
});

describe('the payment form', () => {
  it('starts with what is still owed, received today by bank transfer', () => {
    const issued = draft({ status: 'issued', balanceMinor: 12345 });
    expect(paymentFormValues(issued, '2026-12-04')).toEqual({
      method: 'bank-transfer',
      amount: '123.45',
      receivedOn: '2026-12-04',
      reference: '',
    });
    expect(paymentFormValues(draft({ currency: 'JPY', balanceMinor: 1200 }), '2026-12-04').amount).toBe(
      '1200',
    );
  });

  it('refuses nothing paid, decimals the currency has none of, and online card payments', () => {
    const base = { method: 'cash', amount: '10', receivedOn: '2026-12-04', reference: '' };
    expect(issuesOf(paymentFormSchema('GBP').safeParse({ ...base, amount: '0' }))).toEqual({
      amount: 'The amount is more than 0.',
    });
    expect(issuesOf(paymentFormSchema('JPY').safeParse({ ...base, amount: '10.5' }))).toEqual({
      amount: 'JPY has no decimals.',
    });
    expect(paymentFormSchema('GBP').safeParse({ ...base, method: 'card-online' }).success).toBe(false);
    expect(paymentFormSchema('GBP').parse(base)).toEqual(base);
  });
});

describe('where a server issue goes', () => {
  it('puts a line’s issue under that line’s field', () => {
    expect(invoiceFieldFor('lines.2.unitPrice')).toBe('lines.2.unitPrice');
    expect(invoiceFieldFor('lines.0.quantity')).toBe('lines.0.quantity');
  });

  it('puts an issue about a whole line, or its price-list item, under its description', () => {
    expect(invoiceFieldFor('lines.1')).toBe('lines.1.description');
    expect(invoiceFieldFor('lines.0.priceItemId')).toBe('lines.0.description');
  });

  it('keeps other fields and leaves the version to the stale-version message', () => {
    expect(invoiceFieldFor('billToUserId')).toBe('billToUserId');
    expect(invoiceFieldFor('lines')).toBe('lines');
    expect(invoiceFieldFor('version')).toBeNull();
  });
});

describe('the totals preview', () => {
  const vat = { currency: 'GBP', taxLabel: 'VAT', taxRateBp: 2000, pricesIncludeTax: false };

  it('rounds each line to the penny and adds the tax on top once', () => {
    const preview = previewTotals(
      [
        { quantity: '2', unitPrice: '45' },
        { quantity: '1.5', unitPrice: '12.34' },
        { quantity: '0.33', unitPrice: '0.05' },
      ],
      vat,
    );
    // 2 × 45.00; 1.5 × 12.34 = 18.51; 0.33 × 0.05 = 0.0165 → 0.02 (half away from zero).
    expect(preview.amounts).toEqual([9000, 1851, 2]);
    // 20 % of 108.53 = 21.706 → 21.71.
    expect(preview.totals).toEqual({ netMinor: 10853, taxMinor: 2171, totalMinor: 13024 });
    expect(preview.leftOut).toBe(0);
  });

  it('takes the tax out of prices that include it', () => {
    const preview = previewTotals([{ quantity: '1', unitPrice: '108.51' }], {
      ...vat,
      pricesIncludeTax: true,
    });
    // 108.51 / 1.2 = 90.425 → 90.43 net, 18.08 tax.
    expect(preview.totals).toEqual({ netMinor: 9043, taxMinor: 1808, totalMinor: 10851 });
  });

  it('leaves out lines that cannot be read yet, and says how many', () => {
    const preview = previewTotals(
      [
        { quantity: '1', unitPrice: '1200' },
        { quantity: '', unitPrice: '5' },
        { quantity: '1', unitPrice: '12.5' },
      ],
      { ...vat, currency: 'JPY', taxRateBp: 1000 },
    );
    expect(preview.amounts).toEqual([1200, null, null]);
    expect(preview.totals).toEqual({ netMinor: 1200, taxMinor: 120, totalMinor: 1320 });
    expect(preview.leftOut).toBe(2);
  });
});

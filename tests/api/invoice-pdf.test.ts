import { describe, expect, it } from 'vitest';
import { renderInvoicePdf, type InvoicePdfOptions } from '../../api/lib/invoice-pdf';
import { invoiceTotals, lineAmount } from '@shared/billing/money';
import type { InvoiceDetail, InvoiceLineView } from '@shared/schemas/billing';
import { readPdf, type PdfReading } from '../helpers/pdf-text';

/*
 * The PDF is read back through its fonts' ToUnicode maps (tests/helpers/pdf-text.ts), the way a
 * viewer's search does, from the very bytes a client receives: no test-only font or uncompressed mode.
 * A glyph the embedded font lacks reads as U+0000 there, so "£", "€", "¥" and "ř" are checked for real.
 */

const options: InvoicePdfOptions = { companyName: 'Tidewell Aquatics', timeZone: 'Europe/London' };
const a4 = { width: 595.28, height: 841.89 };

function line(
  description: string,
  quantityHundredths: number,
  unit: string,
  unitPriceMinor: number,
): InvoiceLineView {
  return {
    id: `line-${description}`,
    kind: 'consumable',
    description,
    quantityHundredths,
    unit,
    unitPriceMinor,
    amountMinor: lineAmount(quantityHundredths, unitPriceMinor),
    priceItemId: null,
  };
}

/** An issued invoice whose totals come from the shared money rules, as the service stores them. */
function invoice(overrides: Partial<InvoiceDetail> = {}): InvoiceDetail {
  const base: InvoiceDetail = {
    id: 'invoice-1',
    kind: 'invoice',
    status: 'issued',
    number: 'INV-000042',
    tank: { id: 'tank-1', name: 'Lounge reef' },
    billToName: 'Helen Ashdown',
    billToEmail: 'helen@ashdown-home.test',
    billToUserId: 'owner-1',
    currency: 'GBP',
    taxRateBp: 2000,
    taxLabel: 'VAT',
    pricesIncludeTax: false,
    totalMinor: 0,
    netMinor: 0,
    taxMinor: 0,
    balanceMinor: 0,
    paidMinor: 0,
    creditedMinor: 0,
    issueDate: '2026-03-01',
    dueDate: '2026-03-15',
    createdAt: '2026-02-27T10:00:00Z',
    version: 3,
    timeZone: 'Europe/London',
    note: '',
    reason: null,
    paidAt: null,
    lines: [
      line('Routine service, systems up to 300 litres', 100, 'visit', 6500),
      line('Salt mix', 150, 'bag', 3000),
      line('Nitrate test reagent', 300, 'each', 499),
    ],
    payments: [],
    related: [],
    source: { kind: 'visit', id: 'visit-1', label: 'Routine service visit', date: '2026-02-27' },
    seller: {
      name: 'Tidewell Aquatics Ltd',
      address: '12 Harbour Row\nPortsmouth PO1 2AB',
      taxId: 'GB 123 4567 89',
      footer: 'Pay by bank transfer to Tidewell Aquatics Ltd, sort code 00-00-00, account 00000000.',
    },
    billToChoices: [],
    payable: false,
    ...overrides,
  };
  const totals = invoiceTotals(
    base.lines.map((l) => l.amountMinor),
    base.taxRateBp,
    base.pricesIncludeTax,
  );
  const paidMinor = base.payments.reduce((sum, payment) => sum + payment.amountMinor, 0);
  const open = base.kind === 'invoice' && (base.status === 'issued' || base.status === 'overdue');
  return {
    ...base,
    ...totals,
    paidMinor,
    balanceMinor: open ? totals.totalMinor + base.creditedMinor - paidMinor : 0,
  };
}

async function rendered(detail: InvoiceDetail, with_: InvoicePdfOptions = options) {
  const bytes = await renderInvoicePdf(detail, with_);
  return { bytes, pdf: readPdf(bytes) };
}

/** What every document must be, whatever it says. */
function expectSoundDocument(bytes: Buffer, pdf: PdfReading) {
  expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
  expect(pdf.pageObjects).toBe(pdf.pages.length);
  expect(pdf.fonts.length).toBeGreaterThan(0);
  for (const font of pdf.fonts) expect(font).toMatch(/^[A-Z]{6}\+MerriweatherSans-(Regular|Bold)$/);
  // U+0000: a glyph missing from the embedded font; U+FFFD: a code the font cannot map back to text.
  expect(pdf.text).not.toContain('\u0000');
  expect(pdf.text).not.toContain('\uFFFD');
  pdf.pages.forEach((page, index) => {
    expect(page.lines.at(-1)).toBe(`Page ${index + 1} of ${pdf.pages.length}`);
    for (const fragment of page.fragments.filter((f) => f.text !== 'DRAFT')) {
      expect(fragment.x).toBeGreaterThanOrEqual(40);
      expect(fragment.x + fragment.width).toBeLessThanOrEqual(a4.width - 40);
      expect(fragment.y).toBeGreaterThanOrEqual(40);
      expect(fragment.y).toBeLessThanOrEqual(a4.height - 40);
    }
  });
}

describe('renderInvoicePdf', () => {
  it('renders an issued GBP invoice with tax added: seller, client, lines, totals, payments and balance', async () => {
    const detail = invoice({
      payments: [
        {
          id: 'payment-1',
          method: 'bank-transfer',
          amountMinor: 5000,
          currency: 'GBP',
          receivedAt: '2026-03-05T09:00:00Z',
          reference: 'HD-0305',
        },
      ],
    });

    const { bytes, pdf } = await rendered(detail);

    expectSoundDocument(bytes, pdf);
    expect(pdf.pages).toHaveLength(1);
    const lines = pdf.pages[0]!.lines;
    // 65.00 + 1.5 × 30.00 + 3 × 4.99 = 124.97; 20 % of it is 24.994, which rounds to 24.99.
    expect(lines).toEqual(
      expect.arrayContaining([
        'Tidewell Aquatics Ltd',
        'Invoice',
        'INV-000042',
        '12 Harbour Row',
        'Portsmouth PO1 2AB',
        'VAT number: GB 123 4567 89',
        'Issue date: 1 Mar 2026',
        'Due date: 15 Mar 2026',
        'BILL TO TANK',
        'Helen Ashdown Lounge reef',
        'helen@ashdown-home.test',
        'Routine service visit, 27 Feb 2026',
        'DESCRIPTION QUANTITY UNIT PRICE AMOUNT',
        'Routine service, systems up to 300 litres 1 visit £65.00 £65.00',
        'Salt mix 1.5 bag £30.00 £45.00',
        'Nitrate test reagent 3 each £4.99 £14.97',
        'Net £124.97',
        'VAT 20 % £24.99',
        'Total £149.96',
        'Paid 5 Mar 2026, bank transfer (HD-0305) -£50.00',
        'Balance due £99.96',
        'Pay by bank transfer to Tidewell Aquatics Ltd, sort code 00-00-00, account 00000000.',
      ]),
    );
    expect(pdf.text).not.toContain('Prices include');
    expect(pdf.text).not.toContain('DRAFT');
    expect(pdf.info).toMatchObject({
      Title: 'Invoice INV-000042',
      Author: 'Tidewell Aquatics',
      CreationDate: 'D:20260301000000Z',
    });
  });

  it('dates the document from the start of its issue day in the company’s zone', async () => {
    const { pdf } = await rendered(invoice(), { ...options, timeZone: 'Europe/Berlin' });

    expect(pdf.info.CreationDate).toBe('D:20260228230000Z');
  });

  it('gives the same bytes for the same invoice rendered twice', async () => {
    const first = await renderInvoicePdf(invoice(), options);
    const second = await renderInvoicePdf(invoice(), options);

    expect(first.equals(second)).toBe(true);
  });

  it('says prices include the tax and takes it out of the total (EUR)', async () => {
    const detail = invoice({
      currency: 'EUR',
      pricesIncludeTax: true,
      lines: [line('Routine service', 100, 'visit', 9000), line('Carbon media', 200, 'pot', 1500)],
    });

    const { bytes, pdf } = await rendered(detail);

    expectSoundDocument(bytes, pdf);
    // 120.00 including 20 %: net 120 / 1.2 = 100.00, tax 20.00.
    expect(pdf.pages[0]!.lines).toEqual(
      expect.arrayContaining([
        'Carbon media 2 pot €15.00 €30.00',
        'Net €100.00',
        'VAT 20 % €20.00',
        'Total €120.00',
      ]),
    );
    expect(pdf.text).toContain('Prices include VAT.');
  });

  it('writes yen without decimals (JPY)', async () => {
    const detail = invoice({
      currency: 'JPY',
      taxRateBp: 1000,
      taxLabel: 'Consumption tax',
      lines: [line('Routine service', 200, 'visit', 5500)],
    });

    const { bytes, pdf } = await rendered(detail);

    expectSoundDocument(bytes, pdf);
    expect(pdf.pages[0]!.lines).toEqual(
      expect.arrayContaining([
        'Routine service 2 visit JP¥5,500 JP¥11,000',
        'Net JP¥11,000',
        'Consumption tax 10 % JP¥1,100',
        'Total JP¥12,100',
      ]),
    );
    expect(pdf.text).not.toMatch(/JP¥[\d,]+\.\d/);
  });

  it('renders a credit note: its number, the invoice it credits and why, and no balance', async () => {
    const detail = invoice({
      kind: 'credit-note',
      number: 'CN-000007',
      dueDate: null,
      reason: 'Reagent returned unopened.',
      lines: [line('Nitrate test reagent', 300, 'each', -499)],
      related: [
        {
          id: 'invoice-1',
          kind: 'invoice',
          number: 'INV-000042',
          totalMinor: 14996,
          issueDate: '2026-03-01',
        },
      ],
    });

    const { bytes, pdf } = await rendered(detail);

    expectSoundDocument(bytes, pdf);
    expect(pdf.pages[0]!.lines).toEqual(
      expect.arrayContaining([
        'Tidewell Aquatics Ltd',
        'Credit note',
        'CN-000007',
        'CREDITS',
        'Invoice INV-000042 of 1 Mar 2026, £149.96',
        'REASON',
        'Reagent returned unopened.',
        'Nitrate test reagent 3 each -£4.99 -£14.97',
        'Net -£14.97',
        'VAT 20 % -£2.99',
        'Total credited -£17.96',
      ]),
    );
    expect(pdf.text).not.toContain('Due date');
    expect(pdf.text).not.toContain('Balance due');
    expect(pdf.info.Title).toBe('Credit note CN-000007');
  });

  it('lists credit notes against an invoice and, once paid, says when', async () => {
    const detail = invoice({
      status: 'paid',
      paidAt: '2026-03-12T23:30:00Z',
      creditedMinor: -1796,
      related: [
        {
          id: 'credit-1',
          kind: 'credit-note',
          number: 'CN-000007',
          totalMinor: -1796,
          issueDate: '2026-03-10',
        },
      ],
      payments: [
        {
          id: 'p1',
          method: 'card-online',
          amountMinor: 13200,
          currency: 'GBP',
          receivedAt: '2026-03-12T23:30:00Z',
          reference: '',
        },
      ],
    });

    const { bytes, pdf } = await rendered(detail, { ...options, timeZone: 'Europe/Berlin' });

    expectSoundDocument(bytes, pdf);
    // 23:30 UTC on the 12th is already the 13th in Berlin.
    expect(pdf.pages[0]!.lines).toEqual(
      expect.arrayContaining([
        'Paid on 13 Mar 2026',
        'Credit note CN-000007, 10 Mar 2026 -£17.96',
        'Paid 13 Mar 2026, card, paid online -£132.00',
        'Balance due £0.00',
      ]),
    );
  });

  it('marks a cancelled invoice and gives the reason instead of a balance', async () => {
    const detail = invoice({ status: 'void', reason: 'Raised for the wrong tank.' });

    const { bytes, pdf } = await rendered(detail);

    expectSoundDocument(bytes, pdf);
    expect(pdf.pages[0]!.lines).toEqual(
      expect.arrayContaining(['Cancelled', 'WHY IT WAS CANCELLED', 'Raised for the wrong tank.']),
    );
    expect(pdf.text).not.toContain('Balance due');
  });

  it('marks a draft as not valid on every page and names the company while it has no seller', async () => {
    const detail = invoice({
      status: 'draft',
      number: null,
      issueDate: null,
      dueDate: null,
      seller: null,
      lines: Array.from({ length: 40 }, (_, index) =>
        line(`Coral food, pack ${index + 1}`, 100, 'pack', 850),
      ),
    });

    const { bytes, pdf } = await rendered(detail);

    expectSoundDocument(bytes, pdf);
    expect(pdf.pages.length).toBeGreaterThan(1);
    const first = pdf.pages[0]!.lines;
    expect(first[0]).toBe('DRAFT — not a valid invoice');
    expect(first).toEqual(
      expect.arrayContaining(['Tidewell Aquatics', 'Invoice', 'Not numbered yet', 'Drafted: 27 Feb 2026']),
    );
    expect(pdf.text).not.toContain('Tidewell Aquatics Ltd');
    expect(pdf.text).not.toContain('Issue date');
    for (const page of pdf.pages) expect(page.lines).toContain('DRAFT');
    expect(pdf.info).toMatchObject({ Title: 'Invoice (draft)', CreationDate: 'D:20260227100000Z' });
  });

  it('says so when a draft has no lines yet', async () => {
    const { bytes, pdf } = await rendered(
      invoice({ status: 'draft', number: null, seller: null, lines: [] }),
    );

    expectSoundDocument(bytes, pdf);
    expect(pdf.pages[0]!.lines).toEqual(
      expect.arrayContaining(['DESCRIPTION QUANTITY UNIT PRICE AMOUNT', 'No lines yet.', 'Total £0.00']),
    );
  });

  it('continues a long invoice over pages, repeating the table header, numbering every page', async () => {
    const items = Array.from({ length: 60 }, (_, index) =>
      line(`Item ${index + 1}: frozen mysis, 100 g flat pack, for the lounge reef`, 100, 'pack', 650),
    );
    const detail = invoice({ lines: items });

    const { bytes, pdf } = await rendered(detail);

    expectSoundDocument(bytes, pdf);
    const count = pdf.pages.length;
    expect(count).toBeGreaterThan(1);
    expect(pdf.text).toContain(`Page 2 of ${count}`);
    pdf.pages.forEach((page, index) => {
      expect(page.lines).toContain('DESCRIPTION QUANTITY UNIT PRICE AMOUNT');
      expect(page.lines).toContain(
        'Pay by bank transfer to Tidewell Aquatics Ltd, sort code 00-00-00, account 00000000.',
      );
      if (index > 0) expect(page.lines[0]).toBe('Invoice INV-000042 — continued Helen Ashdown');
      expect(page.lines.some((l) => l.startsWith('Total '))).toBe(index === count - 1);
    });
    // Every line once, in order, none lost at a page break.
    const shown = pdf.pages.flatMap((page) => page.lines.filter((l) => /^Item \d+:/.test(l)));
    expect(shown).toEqual(items.map((item) => `${item.description} 1 pack £6.50 £6.50`));
    // 60 × 6.50 = 390.00, plus 20 % = 468.00.
    expect(pdf.pages.at(-1)!.lines).toEqual(
      expect.arrayContaining(['Net £390.00', 'VAT 20 % £78.00', 'Total £468.00']),
    );
  });

  it('wraps a long description inside its column', async () => {
    const long =
      'Quarterly deep service: full water change of the sump, skimmer strip-down and clean, return pump impeller ' +
      'inspected, probes calibrated against reference solutions, glass cleaned inside and out, and the log updated.';
    const { bytes, pdf } = await rendered(invoice({ lines: [line(long, 100, 'visit', 18000)] }));

    expectSoundDocument(bytes, pdf);
    const lines = pdf.pages[0]!.lines;
    const first = lines.findIndex((l) => l.startsWith('Quarterly deep service'));
    expect(first).toBeGreaterThan(-1);
    expect(lines[first]).toMatch(/ 1 visit £180\.00 £180\.00$/);
    const wrapped = [
      lines[first]!.replace(/ 1 visit £180\.00 £180\.00$/, ''),
      ...lines.slice(first + 1, first + 4),
    ];
    expect(wrapped.length).toBeGreaterThan(1);
    expect(wrapped.join(' ').startsWith(long)).toBe(true);
  });

  it('writes Latin Extended names with the matching subset of the brand font', async () => {
    const detail = invoice({
      billToName: 'Zdeněk Dvořák',
      seller: { name: 'Łódź Rafa Sp. z o.o.', address: 'ul. Żeglarska 4', taxId: 'PL0000000000', footer: '' },
      currency: 'PLN',
    });

    const { bytes, pdf } = await rendered(detail);

    expectSoundDocument(bytes, pdf);
    expect(pdf.pages[0]!.lines).toEqual(
      expect.arrayContaining([
        'Łódź Rafa Sp. z o.o.',
        'ul. Żeglarska 4',
        'Zdeněk Dvořák Lounge reef',
        'Total PLN\u00a0149.96',
      ]),
    );
    expect(new Set(pdf.fonts.map((font) => font.replace(/^[A-Z]+\+/, ''))).size).toBe(2);
    expect(pdf.fonts.length).toBeGreaterThan(2);
  });

  it('prints a question mark for a script the brand font does not cover, never an empty glyph', async () => {
    const { bytes, pdf } = await rendered(invoice({ billToName: '山田 Taro\u200b' }));

    expectSoundDocument(bytes, pdf);
    expect(pdf.pages[0]!.lines).toContain('?? Taro Lounge reef');
  });
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  currencies,
  currencyDigits,
  divideRounded,
  invoiceTotals,
  lineAmount,
  minorToText,
  parseMoney,
  parseQuantity,
  quantityToText,
} from '@shared/billing/money';

describe('parseMoney', () => {
  it.each([
    { text: '12.5', currency: 'GBP', minor: 1250 },
    { text: '12,50', currency: 'GBP', minor: 1250 },
    { text: ' 12.50 ', currency: 'EUR', minor: 1250 },
    { text: '0.01', currency: 'USD', minor: 1 },
    { text: '7', currency: 'CHF', minor: 700 },
    { text: '1000000', currency: 'GBP', minor: 100_000_000 },
    { text: '1200', currency: 'JPY', minor: 1200 },
    { text: '1000000', currency: 'JPY', minor: 1_000_000 },
  ])('reads "$text" $currency as $minor minor units', ({ text, currency, minor }) => {
    expect(parseMoney(text, currency)).toEqual({ ok: true, minor });
  });

  it.each([
    { text: '12.505', currency: 'GBP', message: 'Use an amount such as 12.50 (at most two decimals).' },
    { text: '1200.5', currency: 'JPY', message: 'JPY has no decimals.' },
    { text: '1000000.01', currency: 'GBP', message: 'At most 1,000,000.' },
    { text: '1000001', currency: 'JPY', message: 'At most 1,000,000.' },
    { text: '-3.75', currency: 'GBP', message: 'The amount cannot be negative.' },
  ])('refuses "$text" $currency: $message', ({ text, currency, message }) => {
    expect(parseMoney(text, currency)).toEqual({ ok: false, message });
  });

  it.each(['', 'abc', '12.', '.5', '1,000', '1.000,50', '12.5.0', '99999999', '£12', '1e3', '0x10'])(
    'refuses "%s", which is no amount it can read without guessing',
    (text) => {
      const parsed = parseMoney(text, 'GBP');
      expect(parsed.ok).toBe(false);
    },
  );

  it('reads a negative amount only where asked to, and never gives -0', () => {
    expect(parseMoney('-3.75', 'GBP', { allowNegative: true })).toEqual({ ok: true, minor: -375 });
    const zero = parseMoney('-0.00', 'GBP', { allowNegative: true });
    expect(zero.ok && Object.is(zero.minor, 0)).toBe(true);
  });

  it('round-trips every amount through minorToText', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 100_000_000 }),
        fc.constantFrom(...currencies),
        (minor, currency) => {
          const bounded = currencyDigits[currency] === 0 ? Math.min(minor, 1_000_000) : minor;
          expect(parseMoney(minorToText(bounded, currency), currency)).toEqual({ ok: true, minor: bounded });
        },
      ),
    );
  });
});

describe('parseQuantity', () => {
  it.each([
    { text: '2', hundredths: 200 },
    { text: '1.5', hundredths: 150 },
    { text: '0,25', hundredths: 25 },
    { text: '0.01', hundredths: 1 },
    { text: '10000', hundredths: 1_000_000 },
  ])('reads "$text" as $hundredths hundredths', ({ text, hundredths }) => {
    expect(parseQuantity(text)).toEqual({ ok: true, hundredths });
    expect(parseQuantity(quantityToText(hundredths))).toEqual({ ok: true, hundredths });
  });

  it.each([
    { text: '0', message: 'The quantity is more than 0.' },
    { text: '0.00', message: 'The quantity is more than 0.' },
    { text: '10000.01', message: 'At most 10,000.' },
  ])('refuses "$text": $message', ({ text, message }) => {
    expect(parseQuantity(text)).toEqual({ ok: false, message });
  });

  it.each(['-1', '1.255', '', 'two', '1,000.5', '123456'])('refuses "%s"', (text) => {
    expect(parseQuantity(text).ok).toBe(false);
  });
});

describe('divideRounded', () => {
  // Half away from zero ("commercial rounding"): 2.5 → 3 and −2.5 → −3, so a credit note is the
  // exact negative of the amounts it takes back.
  it.each([
    [5n, 2n, 3n],
    [-5n, 2n, -3n],
    [1n, 2n, 1n],
    [-1n, 2n, -1n],
    [7n, 3n, 2n],
    [-7n, 3n, -2n],
    [8n, 3n, 3n],
    [-8n, 3n, -3n],
    [4n, 2n, 2n],
    [0n, 7n, 0n],
    [149n, 100n, 1n],
    [150n, 100n, 2n],
    [-150n, 100n, -2n],
  ])('%d / %d rounds to %d', (numerator, denominator, expected) => {
    expect(divideRounded(numerator, denominator)).toBe(expected);
  });

  it('stays exact far beyond floating point', () => {
    expect(divideRounded(10n ** 30n + 5n, 10n)).toBe(10n ** 29n + 1n);
    expect(divideRounded(-(10n ** 30n) - 4n, 10n)).toBe(-(10n ** 29n));
  });

  it('refuses a denominator that is not positive', () => {
    expect(() => divideRounded(1n, 0n)).toThrow(RangeError);
    expect(() => divideRounded(1n, -2n)).toThrow(RangeError);
  });

  it('is symmetric: rounding −n is minus rounding n', () => {
    fc.assert(
      fc.property(
        fc.bigInt({ min: -(10n ** 20n), max: 10n ** 20n }),
        fc.bigInt({ min: 1n, max: 10n ** 6n }),
        (n, d) => {
          expect(divideRounded(-n, d)).toBe(-divideRounded(n, d));
        },
      ),
    );
  });
});

describe('lineAmount', () => {
  it('rounds quantity × unit price once, half away from zero', () => {
    // 1.5 × 0.99 = 1.485 → 1.49; taken back on a credit note: −1.485 → −1.49.
    expect(lineAmount(150, 99)).toBe(149);
    expect(lineAmount(150, -99)).toBe(-149);
    // 1.25 h × 60.00 = 75.00 exactly.
    expect(lineAmount(125, 6000)).toBe(7500);
    // 0.33 × 0.10 = 0.033 → 0.03.
    expect(lineAmount(33, 10)).toBe(3);
  });
});

describe('invoiceTotals', () => {
  /*
   * Worked example, GBP, 20 % VAT, checked by hand:
   *   1    × 95.00 = 95.00
   *   4    ×  3.75 = 15.00
   *   1    ×  8.99 =  8.99
   *   1.25 × 60.00 = 75.00
   *   lines add up to 95.00 + 15.00 + 8.99 + 75.00 = 193.99
   * Prices include tax: net = 193.99 / 1.20 = 161.6583… → 161.66; tax = 193.99 − 161.66 = 32.33
   *   (check: 161.66 × 0.20 = 32.332, which rounds to the same 32.33).
   * Prices exclude tax: tax = 193.99 × 0.20 = 38.798 → 38.80; total = 193.99 + 38.80 = 232.79.
   */
  const example = [lineAmount(100, 9500), lineAmount(400, 375), lineAmount(100, 899), lineAmount(125, 6000)];

  it('adds the lines of the worked example to 193.99', () => {
    expect(example).toEqual([9500, 1500, 899, 7500]);
  });

  it('takes the tax out of prices that include it: net 161.66, tax 32.33, total 193.99', () => {
    expect(invoiceTotals(example, 2000, true)).toEqual({
      netMinor: 16166,
      taxMinor: 3233,
      totalMinor: 19399,
    });
  });

  it('adds the tax to prices that exclude it: net 193.99, tax 38.80, total 232.79', () => {
    expect(invoiceTotals(example, 2000, false)).toEqual({
      netMinor: 19399,
      taxMinor: 3880,
      totalMinor: 23279,
    });
  });

  it('gives a credit note for every line exactly the negative totals', () => {
    const negated = example.map((amount) => -amount);
    expect(invoiceTotals(negated, 2000, true)).toEqual({
      netMinor: -16166,
      taxMinor: -3233,
      totalMinor: -19399,
    });
    expect(invoiceTotals(negated, 2000, false)).toEqual({
      netMinor: -19399,
      taxMinor: -3880,
      totalMinor: -23279,
    });
  });

  it('rounds the tax once per invoice, which can differ from rounding it per line', () => {
    // Three lines of 0.03 at 20 %, tax on top. Per line: 0.006 → 0.01 each, 0.03 in all.
    // Per invoice: 0.09 × 0.20 = 0.018 → 0.02. The UK allows either (HMRC VAT Notice 700 §17.5,
    // from memory); we round once per invoice so "tax = rate × net" holds on the page.
    const lines = [3, 3, 3];
    const perLine = lines.reduce((sum, amount) => sum + invoiceTotals([amount], 2000, false).taxMinor, 0);
    const perInvoice = invoiceTotals(lines, 2000, false).taxMinor;
    expect(perLine).toBe(3);
    expect(perInvoice).toBe(2);
  });

  it('handles 0 % and currencies without a minor unit', () => {
    expect(invoiceTotals([1000, 250], 0, true)).toEqual({ netMinor: 1250, taxMinor: 0, totalMinor: 1250 });
    // JPY, 10 % consumption tax included: 1,100 yen → net 1,000, tax 100.
    expect(invoiceTotals([1100], 1000, true)).toEqual({ netMinor: 1000, taxMinor: 100, totalMinor: 1100 });
  });

  it('refuses a tax rate outside 0 to 100 % or one that is not whole basis points', () => {
    expect(() => invoiceTotals([100], -1, true)).toThrow(RangeError);
    expect(() => invoiceTotals([100], 10_001, true)).toThrow(RangeError);
    expect(() => invoiceTotals([100], 20.5, true)).toThrow(RangeError);
  });

  const lineLists = fc.array(fc.integer({ min: -10_000_000, max: 100_000_000 }), { maxLength: 100 });
  const rates = fc.integer({ min: 0, max: 10_000 });

  it('with tax included: net + tax = total, and net is total / (1 + rate) within half a minor unit', () => {
    fc.assert(
      fc.property(lineLists, rates, (lines, rateBp) => {
        const { netMinor, taxMinor, totalMinor } = invoiceTotals(lines, rateBp, true);
        expect(netMinor + taxMinor).toBe(totalMinor);
        expect(totalMinor).toBe(lines.reduce((sum, amount) => sum + amount, 0));
        // |net − total × 10000 / (10000 + rate)| ≤ ½, multiplied out to stay in integers.
        const error = BigInt(netMinor) * BigInt(10_000 + rateBp) - BigInt(totalMinor) * 10_000n;
        const abs = error < 0n ? -error : error;
        expect(abs * 2n <= BigInt(10_000 + rateBp)).toBe(true);
      }),
    );
  });

  it('with tax excluded: net + tax = total, and tax is net × rate within half a minor unit', () => {
    fc.assert(
      fc.property(lineLists, rates, (lines, rateBp) => {
        const { netMinor, taxMinor, totalMinor } = invoiceTotals(lines, rateBp, false);
        expect(netMinor + taxMinor).toBe(totalMinor);
        const error = BigInt(taxMinor) * 10_000n - BigInt(netMinor) * BigInt(rateBp);
        const abs = error < 0n ? -error : error;
        expect(abs * 2n <= 10_000n).toBe(true);
      }),
    );
  });
});

describe('currencyDigits', () => {
  // ISO 4217 list one gives the minor unit of each code; the runtime's CLDR data (ICU, through
  // Intl) carries the same figures, so the table is checked against it rather than against memory.
  it.each(currencies)('%s has as many decimals as Intl formats it with', (currency) => {
    const cldr = new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions();
    expect(currencyDigits[currency]).toBe(cldr.maximumFractionDigits);
  });
});

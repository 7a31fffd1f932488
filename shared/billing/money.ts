/*
 * Money, exactly: amounts are integers in the currency's minor unit (cents, pence; yen have none),
 * quantities are integers in hundredths, and every division rounds once, on integers (BigInt), so
 * no floating point ever touches an amount.
 *
 * Rounding: half away from zero ("commercial rounding"), once per line (quantity × unit price) and
 * once per invoice for the tax. Why: tax authorities ask for amounts rounded to the nearest minor
 * unit, and a client checking an invoice with a calculator expects 0.5 to go up (for example the UK's
 * VAT Notice 700 §17.5 allows rounding to the nearest penny per line or per invoice — from memory).
 * Half-to-even only helps when many roundings are summed; with one tax rounding per invoice there
 * is no bias to remove. Taxing the invoice total rather than each line keeps "tax = rate × net" true
 * on the page.
 */

/**
 * ISO 4217 codes we bill in, with their minor-unit digits (ISO 4217 list one; checked against the
 * runtime's CLDR data in tests/shared/billing/money.test.ts). Currencies with three decimals are left
 * out: the product limits prices to two decimals of the major unit.
 */
export const currencyDigits = {
  EUR: 2,
  GBP: 2,
  USD: 2,
  CAD: 2,
  AUD: 2,
  NZD: 2,
  CHF: 2,
  SEK: 2,
  NOK: 2,
  DKK: 2,
  PLN: 2,
  CZK: 2,
  ZAR: 2,
  SGD: 2,
  JPY: 0,
} as const;
export type Currency = keyof typeof currencyDigits;
export const currencies = Object.keys(currencyDigits) as Currency[];

export const isCurrency = (code: string): code is Currency => Object.hasOwn(currencyDigits, code);

export function minorDigits(currency: string): number {
  return isCurrency(currency) ? currencyDigits[currency] : 2;
}

/** The largest unit price or line amount accepted: 1,000,000 in the major unit. */
export const maxUnitPriceMajor = 1_000_000;
/** The largest quantity on a line. */
export const maxQuantity = 10_000;
/** Tax rates are kept in basis points (hundredths of a percent): 2000 = 20 %, 810 = 8.1 %. */
export const maxTaxRateBp = 10_000;

const moneyPattern = /^(-)?(\d{1,7})(?:[.,](\d{1,2}))?$/;

/**
 * Money typed in the major unit ("12.5", "12,50", "-3.75") to minor units, or a sentence saying
 * what is wrong. At most two decimals, and none for a currency without a minor unit.
 */
export function parseMoney(
  text: string,
  currency: string,
  options: { allowNegative?: boolean } = {},
): { ok: true; minor: number } | { ok: false; message: string } {
  const trimmed = text.trim().replace(/\s/g, '');
  const match = moneyPattern.exec(trimmed);
  if (!match) return { ok: false, message: 'Use an amount such as 12.50 (at most two decimals).' };
  const [, minus, whole, fraction = ''] = match;
  const digits = minorDigits(currency);
  if (fraction.length > digits) {
    return {
      ok: false,
      message: digits === 0 ? `${currency} has no decimals.` : `At most ${digits} decimals.`,
    };
  }
  if (minus && !options.allowNegative) return { ok: false, message: 'The amount cannot be negative.' };
  const minor = Number(whole) * 10 ** digits + Number(fraction.padEnd(digits, '0') || '0');
  if (minor > maxUnitPriceMajor * 10 ** digits) {
    return { ok: false, message: `At most ${maxUnitPriceMajor.toLocaleString('en')}.` };
  }
  return { ok: true, minor: minus && minor !== 0 ? -minor : minor };
}

const quantityPattern = /^(\d{1,5})(?:[.,](\d{1,2}))?$/;

/** A quantity typed ("2", "1.5", "0,25") to hundredths, or a sentence saying what is wrong. */
export function parseQuantity(
  text: string,
): { ok: true; hundredths: number } | { ok: false; message: string } {
  const match = quantityPattern.exec(text.trim());
  if (!match) return { ok: false, message: 'Use a quantity such as 2 or 1.5 (at most two decimals).' };
  const hundredths = Number(match[1]) * 100 + Number((match[2] ?? '').padEnd(2, '0'));
  if (hundredths <= 0) return { ok: false, message: 'The quantity is more than 0.' };
  if (hundredths > maxQuantity * 100)
    return { ok: false, message: `At most ${maxQuantity.toLocaleString('en')}.` };
  return { ok: true, hundredths };
}

/** Integer division rounding half away from zero, exact for any size. */
export function divideRounded(numerator: bigint, denominator: bigint): bigint {
  if (denominator <= 0n) throw new RangeError('denominator must be positive');
  const negative = numerator < 0n;
  const n = negative ? -numerator : numerator;
  const quotient = n / denominator;
  const rest = n % denominator;
  const rounded = rest * 2n >= denominator ? quotient + 1n : quotient;
  return negative ? -rounded : rounded;
}

/** quantity × unit price, rounded to the minor unit. */
export function lineAmount(quantityHundredths: number, unitPriceMinor: number): number {
  return Number(divideRounded(BigInt(quantityHundredths) * BigInt(unitPriceMinor), 100n));
}

export interface InvoiceTotals {
  /** Before tax. */
  netMinor: number;
  taxMinor: number;
  /** What the client pays. */
  totalMinor: number;
}

/**
 * The totals of lines already rounded: with prices including tax, the lines add up to the total and
 * the tax inside it is total × rate / (1 + rate); otherwise the lines add up to the net and the tax
 * is added on top. One rounding, on the whole invoice.
 */
export function invoiceTotals(
  lineAmounts: readonly number[],
  taxRateBp: number,
  pricesIncludeTax: boolean,
): InvoiceTotals {
  if (!Number.isInteger(taxRateBp) || taxRateBp < 0 || taxRateBp > maxTaxRateBp) {
    throw new RangeError('the tax rate is 0 to 10,000 basis points');
  }
  const sum = lineAmounts.reduce((total, amount) => total + BigInt(amount), 0n);
  const rate = BigInt(taxRateBp);
  if (pricesIncludeTax) {
    const net = divideRounded(sum * 10_000n, 10_000n + rate);
    return { netMinor: Number(net), taxMinor: Number(sum - net), totalMinor: Number(sum) };
  }
  const tax = divideRounded(sum * rate, 10_000n);
  return { netMinor: Number(sum), taxMinor: Number(tax), totalMinor: Number(sum + tax) };
}

/** Minor units as plain text in the major unit, without a symbol: 1250 → "12.50" (for forms and CSV). */
export function minorToText(minor: number, currency: string): string {
  const digits = minorDigits(currency);
  const negative = minor < 0;
  const abs = Math.abs(minor);
  if (digits === 0) return `${negative ? '-' : ''}${abs}`;
  const scale = 10 ** digits;
  const whole = Math.floor(abs / scale);
  const fraction = String(abs % scale).padStart(digits, '0');
  return `${negative ? '-' : ''}${whole}.${fraction}`;
}

/** Hundredths as the shortest plain text: 150 → "1.5", 200 → "2". */
export function quantityToText(hundredths: number): string {
  const whole = Math.trunc(hundredths / 100);
  const fraction = Math.abs(hundredths % 100);
  if (fraction === 0) return String(whole);
  return `${whole}.${String(fraction).padStart(2, '0').replace(/0$/, '')}`;
}

/** Money for people: "£1,234.50", "JP¥1,200" (Intl; en-GB by default). */
export function formatMoney(minor: number, currency: string, locale = 'en-GB'): string {
  const digits = minorDigits(currency);
  return new Intl.NumberFormat(locale, {
    style: 'currency',
    currency,
    minimumFractionDigits: digits,
    maximumFractionDigits: digits,
  }).format(minor / 10 ** digits);
}

/** Basis points as a percentage for people: 2000 → "20 %", 810 → "8.1 %". */
export function formatTaxRate(bp: number): string {
  return `${quantityToText(bp)} %`;
}

const formats = new Map<string, Intl.NumberFormat>();

function format(minimumFractionDigits: number, maximumFractionDigits: number): Intl.NumberFormat {
  const key = `${minimumFractionDigits}:${maximumFractionDigits}`;
  let numberFormat = formats.get(key);
  if (!numberFormat) {
    numberFormat = new Intl.NumberFormat('en', { minimumFractionDigits, maximumFractionDigits });
    formats.set(key, numberFormat);
  }
  return numberFormat;
}

/** A result with a fixed number of decimals, e.g. 1.0260; never "-0.00". */
export function formatFixed(value: number, decimals: number): string {
  const text = format(decimals, decimals).format(value);
  return /^-[0.,]+$/.test(text) ? text.slice(1) : text;
}

/** A number inside a sentence: up to `decimals` decimals, trailing zeros dropped. */
export function formatPlain(value: number, decimals = 4): string {
  const text = format(0, decimals).format(value);
  return /^-[0.,]+$/.test(text) ? text.slice(1) : text;
}

/** Grams read best with fewer decimals as they grow: 2.99 g, 29.9 g, 299 g. */
export function formatGrams(grams: number): string {
  if (grams < 10) return formatFixed(grams, 2);
  if (grams < 100) return formatFixed(grams, 1);
  return formatFixed(grams, 0);
}

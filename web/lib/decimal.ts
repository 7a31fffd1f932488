export type ParsedNumber =
  { state: 'empty' } | { state: 'invalid'; reason: string } | { state: 'number'; value: number };

const plainNumber = /^[-+]?(\d+\.?\d*|\.\d+)$/;

/**
 * Reads what a person typed, accepting a decimal comma ("7,5") as many phones offer it. A comma
 * before exactly three digits ("1,026") could be a decimal or a thousands separator, so it is
 * refused rather than guessed: an SG of 1.026 and a volume of 1026 litres are both likely here.
 */
export function parseDecimal(raw: string): ParsedNumber {
  const text = raw.trim().replace(/\s+/g, '');
  if (text === '') return { state: 'empty' };
  if (/^[-+]?\d+,\d{3}$/.test(text)) {
    const [whole, fraction] = text.split(',');
    return {
      state: 'invalid',
      reason: `Write ${whole}.${fraction} or ${whole}${fraction} — a comma here could mean either.`,
    };
  }
  const normal = /^[-+]?\d*,\d+$/.test(text) ? text.replace(',', '.') : text;
  if (!plainNumber.test(normal)) return { state: 'invalid', reason: 'Enter a number, such as 7.5.' };
  return { state: 'number', value: Number(normal) };
}

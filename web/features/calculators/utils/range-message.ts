import { formatPlain } from './format-number';

/** How one argument of a chemistry function maps back to what the person typed. */
export interface ArgumentInfo<F extends string> {
  /** The input that shows the message; none when the value was worked out, not typed. */
  field?: F;
  label: string;
  unit?: string;
  /** From the function's units to the field's, e.g. °C → °F or a fraction → %. */
  fromModule?: (value: number) => number;
  /** The argument is a worked-out value: the message says what it came to. */
  derived?: boolean;
  /** Decimals shown for bounds; 4 unless the bounds need more (specific gravity). */
  decimals?: number;
}

export type ArgumentMap<F extends string> = Readonly<Record<string, ArgumentInfo<F>>>;

export interface PlainProblem<F extends string> {
  field?: F;
  message: string;
}

// The chemistry core words every range failure as "<name> must be <bounds> (<basis>), got <value>".
const rangeFailure = /^(.+?) must be (.+?)(?: \((.+)\))?, got (\S+)$/;
const numberInText = /-?\d+(?:\.\d+)?(?:e[-+]?\d+)?/gi;

/**
 * Turns a RangeError from the chemistry core into a sentence in the person's own units, tied to
 * the field it concerns. Returns undefined for an error worded otherwise, so the caller can say
 * something specific; anything that is not a RangeError is a bug and is rethrown.
 */
export function explainRangeError<F extends string>(
  error: unknown,
  args: ArgumentMap<F>,
): PlainProblem<F> | undefined {
  if (!(error instanceof RangeError)) throw error;
  const match = rangeFailure.exec(error.message);
  if (!match) return undefined;
  const [, rawName = '', bounds = '', , got = ''] = match;
  // Worked-out values are named with their input appended: "practical salinity from mSPerCm 1".
  const name = rawName.replace(/ \S+$/, '');
  const info = args[rawName] ?? args[name];
  if (!info) return { message: 'These values are outside what this calculator can work with.' };
  const toField = info.fromModule ?? ((value: number) => value);
  const inFieldUnits = (text: string) =>
    text.replace(numberInText, (number) => formatPlain(toField(Number(number)), info.decimals));
  const unit = info.unit ? ` ${info.unit}` : '';
  // The equation behind a range ("EOS-80 validity") is named on the calculator's Source line; the
  // message itself says only what the person can act on.
  const message = info.derived
    ? `${info.label} comes to ${inFieldUnits(got)}${unit}, but must be ${inFieldUnits(bounds)}${unit}.`
    : `${info.label} must be ${inFieldUnits(bounds)}${unit}.`;
  return info.field === undefined ? { message } : { field: info.field, message };
}

export type Attempt<T, F extends string> = { ok: true; value: T } | ({ ok: false } & PlainProblem<F>);

/** Runs one chemistry call and keeps its failure as plain words. */
export function attempt<T, F extends string>(compute: () => T, args: ArgumentMap<F>): Attempt<T, F> {
  try {
    return { ok: true, value: compute() };
  } catch (error) {
    const problem = explainRangeError(error, args) ?? {
      message: 'These values are outside what this calculator can work with.',
    };
    return { ok: false, ...problem };
  }
}

/**
 * One place for argument checks so every chemistry function rejects bad input the same way:
 * a RangeError whose message names the argument, the allowed range and, where the range comes
 * from an equation's published validity, that equation.
 */
export interface Bounds {
  readonly min?: number;
  readonly max?: number;
  readonly minExclusive?: boolean;
  readonly maxExclusive?: boolean;
  readonly integer?: boolean;
  /** Where the range comes from, shown in brackets, e.g. "PSS-78 validity". */
  readonly basis?: string;
  /**
   * Accept values this far outside min/max, so that a boundary value that went through an
   * equation and its inverse (42 → 42.00000000000002) is not refused for rounding.
   */
  readonly roundingAllowance?: number;
}

export interface OutOfRange {
  readonly argument: string;
  readonly value: number;
  readonly bounds: Bounds;
}

// The RangeErrors stay plain (their message names the equation, for developers and tests); what a
// caller needs to word them for a tank owner is kept beside them.
const outOfRange = new WeakMap<RangeError, OutOfRange>();

/** The argument, value and bounds behind a RangeError from `checkNumber`; undefined for any other error. */
export function outOfRangeDetails(error: unknown): OutOfRange | undefined {
  return error instanceof RangeError ? outOfRange.get(error) : undefined;
}

/** "between 1 and 1.03169", "at least -459.67": the allowed range in words, without its source. */
export function describeBounds({ min, max, minExclusive, maxExclusive }: Bounds): string | undefined {
  const lower = min === undefined ? undefined : `${minExclusive ? 'greater than' : 'at least'} ${min}`;
  const upper = max === undefined ? undefined : `${maxExclusive ? 'less than' : 'at most'} ${max}`;
  if (lower !== undefined && upper !== undefined) {
    return !minExclusive && !maxExclusive ? `between ${min} and ${max}` : `${lower} and ${upper}`;
  }
  return lower ?? upper;
}

export function checkNumber(name: string, value: number, bounds: Bounds = {}): number {
  const basis = bounds.basis === undefined ? '' : ` (${bounds.basis})`;
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${name} must be a finite number, got ${String(value)}`);
  }
  if (bounds.integer && !Number.isInteger(value)) {
    throw new RangeError(`${name} must be a whole number, got ${value}`);
  }
  const { min, max, minExclusive, maxExclusive } = bounds;
  const allowance = bounds.roundingAllowance ?? 0;
  const belowMin = min !== undefined && (minExclusive ? value <= min - allowance : value < min - allowance);
  const aboveMax = max !== undefined && (maxExclusive ? value >= max + allowance : value > max + allowance);
  if (belowMin || aboveMax) {
    const error = new RangeError(`${name} must be ${describeBounds(bounds)}${basis}, got ${value}`);
    outOfRange.set(error, { argument: name, value, bounds });
    throw error;
  }
  return value;
}

export function checkOneOf<T extends string>(name: string, value: T, allowed: readonly T[]): T {
  if (!allowed.includes(value)) {
    throw new RangeError(
      `${name} must be one of ${allowed.map((a) => `'${a}'`).join(', ')}, got ${String(value)}`,
    );
  }
  return value;
}

import { checkNumber } from './range-check';

/**
 * Water changes as a mass balance (common practice derivation): replacing a fraction f of the
 * tank with water at c_new moves the concentration a fraction f of the way to c_new, so after n
 * changes c_n = c_new + (c0 − c_new)(1 − f)^n. Assumes full mixing between changes and no
 * uptake or production in the meantime.
 */

const concentration = { min: 0 } as const;
const fractionRange = { min: 0, minExclusive: true, max: 1 } as const;

export function concentrationAfterWaterChanges(
  c0: number,
  replacementConc: number,
  fraction: number,
  changes = 1,
): number {
  checkNumber('c0', c0, concentration);
  checkNumber('replacementConc', replacementConc, concentration);
  checkNumber('fraction', fraction, fractionRange);
  checkNumber('changes', changes, { min: 0, integer: true });
  return replacementConc + (c0 - replacementConc) * (1 - fraction) ** changes;
}

function checkReachable(c0: number, target: number, replacementConc: number): void {
  const between = (target - replacementConc) * (c0 - target) >= 0;
  if (!between) {
    throw new RangeError(
      `target must lie between c0 (${c0}) and replacementConc (${replacementConc}) to be reached by water changes, got ${target}`,
    );
  }
}

/** Smallest whole number of changes of `fraction` that bring c0 to target or past it. */
export function waterChangesNeeded(
  c0: number,
  target: number,
  replacementConc: number,
  fraction: number,
): number {
  checkNumber('c0', c0, concentration);
  checkNumber('target', target, concentration);
  checkNumber('replacementConc', replacementConc, concentration);
  checkNumber('fraction', fraction, fractionRange);
  checkReachable(c0, target, replacementConc);
  const startGap = Math.abs(c0 - replacementConc);
  const targetGap = Math.abs(target - replacementConc);
  // Tolerance of a few ulps so that a target hit exactly on paper (40 → 20 at 50 %) counts as hit.
  const reached = (gap: number): boolean => gap <= targetGap * (1 + 1e-12);
  if (reached(startGap)) return 0;
  if (fraction === 1) return 1;
  if (targetGap === 0) {
    throw new RangeError(
      `target equal to replacementConc (${replacementConc}) is only approached, never reached, with fraction below 1, got fraction ${fraction}`,
    );
  }
  // log1p keeps small fractions exact; the same form is used to check the estimate, and the
  // correction steps are capped because past 2^53 changes a step of one no longer moves the count.
  const perChange = Math.log1p(-fraction);
  const gapAfter = (changes: number): number => startGap * Math.exp(changes * perChange);
  let changes = Math.max(1, Math.ceil(Math.log(targetGap / startGap) / perChange));
  for (let step = 0; step < 3 && changes > 1 && reached(gapAfter(changes - 1)); step += 1) changes -= 1;
  for (let step = 0; step < 3 && !reached(gapAfter(changes)); step += 1) changes += 1;
  return changes;
}

/** Fraction of the tank to replace in one change to go from c0 to target; 0 when already there. */
export function waterChangeFractionFor(c0: number, target: number, replacementConc: number): number {
  checkNumber('c0', c0, concentration);
  checkNumber('target', target, concentration);
  checkNumber('replacementConc', replacementConc, concentration);
  if (target === c0) return 0;
  checkReachable(c0, target, replacementConc);
  return (c0 - target) / (c0 - replacementConc);
}

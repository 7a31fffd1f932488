import { z } from 'zod';

let supported: ReadonlySet<string> | null = null;

/*
 * The runtime's own list of IANA zones (ECMA-402 `Intl.supportedValuesOf`), plus UTC, which the
 * list leaves out. A zone that the list names under another spelling (Asia/Kolkata, listed as
 * Asia/Calcutta by Node's ICU) is accepted by what it resolves to, so a browser's own zone passes.
 */
export function isKnownTimeZone(zone: string): boolean {
  supported ??= new Set([...Intl.supportedValuesOf('timeZone'), 'UTC']);
  if (supported.has(zone)) return true;
  try {
    return supported.has(new Intl.DateTimeFormat('en', { timeZone: zone }).resolvedOptions().timeZone);
  } catch {
    return false;
  }
}

export const timeZone = z
  .string()
  .trim()
  .min(1)
  .max(64)
  .refine(isKnownTimeZone, 'use a time zone such as Europe/London');

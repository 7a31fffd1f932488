import { z } from 'zod';

/*
 * Keyset paging: a page ends at its last row's sort key, which travels as an opaque token (base64url
 * of the key's parts joined by "|") so clients pass it back rather than build one.
 */

const toBase64Url = (text: string) => btoa(text).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
const fromBase64Url = (token: string) => atob(token.replace(/-/g, '+').replace(/_/g, '/'));

export const cursorMessage = 'use the cursor the previous page gave';

export function encodeCursor(parts: readonly (string | number)[]): string {
  return toBase64Url(parts.join('|'));
}

/** A cursor parameter decoded to `position`'s shape; anything `encodeCursor` did not make is refused. */
export function cursorParam<T extends z.ZodObject>(position: T) {
  const keys = Object.keys(position.shape);
  return z
    .string()
    .max(300)
    .regex(/^[A-Za-z0-9_-]+$/, cursorMessage)
    .transform((token, ctx): z.output<T> => {
      let parts: string[];
      try {
        parts = fromBase64Url(token).split('|');
      } catch {
        parts = [];
      }
      const parsed = position.safeParse(Object.fromEntries(keys.map((key, index) => [key, parts[index]])));
      if (parts.length !== keys.length || !parsed.success) {
        ctx.addIssue({ code: 'custom', message: cursorMessage });
        return z.NEVER;
      }
      return parsed.data;
    });
}

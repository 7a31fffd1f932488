import type { RequestHandler } from 'express';
import { forbidden } from '../lib/http-error';

const safeMethods = new Set(['GET', 'HEAD', 'OPTIONS']);
export const csrfHeader = { name: 'x-requested-with', value: 'brinewatch' } as const;

/**
 * A state change must come from our own pages: the Origin (or Sec-Fetch-Site) says where the
 * request was made, and the custom header is one a cross-site form cannot send without a
 * CORS preflight we never grant (OWASP ASVS V3).
 */
export function sameOriginOnly(appOrigin: string): RequestHandler {
  return (req, _res, next) => {
    if (safeMethods.has(req.method)) return next();
    const origin = req.headers.origin;
    const site = req.headers['sec-fetch-site'];
    const fromOurOrigin = origin !== undefined ? origin === appOrigin : site === 'same-origin';
    if (!fromOurOrigin || req.headers[csrfHeader.name] !== csrfHeader.value) {
      return next(forbidden('This request did not come from the Brinewatch app.'));
    }
    next();
  };
}

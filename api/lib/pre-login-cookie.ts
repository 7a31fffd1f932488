import { createCipheriv, createDecipheriv, hkdfSync, randomBytes } from 'node:crypto';
import type { PendingLogin } from './oidc-client';

/**
 * What a browser carries between leaving for the identity provider and coming back: the OIDC
 * state, nonce, PKCE verifier and where to go afterwards, and the hash of an invitation opened on
 * the way. It lives in a cookie, not a session row, so an anonymous visitor costs no storage
 * until they return signed in at the provider.
 */
export interface PreLogin {
  login?: PendingLogin;
  /** SHA-256 of an invitation token opened before signing in. */
  invitationHash?: string;
}

/** Long enough to type a password and pass a second factor; a stale start just begins again. */
export const preLoginMaxAgeS = 10 * 60;

export const preLoginCookieName = (secure: boolean) => (secure ? '__Host-bw_login' : 'bw_login');

const version = 'v1';

/**
 * Sealed with AES-256-GCM under a key derived from the session secret (HKDF-SHA256): signed, so it
 * cannot be forged, and encrypted, so the nonce and PKCE verifier are unreadable even where the
 * cookie is seen. The expiry travels inside the seal; the cookie's Max-Age is only a courtesy.
 */
export function createPreLoginSeal(sessionSecrets: string[]) {
  // The first secret seals; all of them open, so rotating SESSION_SECRET keeps starts in flight.
  const keys = sessionSecrets.map((secret) =>
    Buffer.from(hkdfSync('sha256', secret, 'brinewatch', 'pre-login cookie v1', 32)),
  );
  if (keys.length === 0) throw new Error('no session secret');

  return {
    seal(value: PreLogin, now: Date): string {
      const iv = randomBytes(12);
      const cipher = createCipheriv('aes-256-gcm', keys[0]!, iv);
      const plain = JSON.stringify({ ...value, exp: now.getTime() + preLoginMaxAgeS * 1000 });
      const body = Buffer.concat([cipher.update(plain, 'utf8'), cipher.final()]);
      return [version, iv, body, cipher.getAuthTag()]
        .map((part) => (typeof part === 'string' ? part : part.toString('base64url')))
        .join('.');
    },

    /** The value, or null for anything missing, forged, damaged or expired. */
    open(sealed: string | undefined, now: Date): PreLogin | null {
      const [tag, iv, body, authTag, ...rest] = (sealed ?? '').split('.');
      if (tag !== version || !iv || !body || !authTag || rest.length > 0) return null;
      for (const key of keys) {
        try {
          const decipher = createDecipheriv('aes-256-gcm', key, Buffer.from(iv, 'base64url'));
          decipher.setAuthTag(Buffer.from(authTag, 'base64url'));
          const plain = Buffer.concat([
            decipher.update(Buffer.from(body, 'base64url')),
            decipher.final(),
          ]).toString('utf8');
          const { exp, ...value } = JSON.parse(plain) as PreLogin & { exp: number };
          return typeof exp === 'number' && exp > now.getTime() ? value : null;
        } catch {
          // Sealed under another key (or not by us): try the next one.
        }
      }
      return null;
    },
  };
}

export type PreLoginSeal = ReturnType<typeof createPreLoginSeal>;

/** The cookie's value from a Cookie header. */
export function readCookie(header: string | undefined, name: string): string | undefined {
  for (const pair of (header ?? '').split(';')) {
    const at = pair.indexOf('=');
    if (at !== -1 && pair.slice(0, at).trim() === name) return pair.slice(at + 1).trim();
  }
  return undefined;
}

import { createECDH } from 'node:crypto';
import webpush from 'web-push';
import { loadOrCreatePrivateJson } from './private-file';

/** The application server's VAPID signing key pair (RFC 8292 §2), both halves base64url. */
export interface VapidKeys {
  /** Uncompressed P-256 point, 65 octets: what the browser gets as `applicationServerKey`. */
  publicKey: string;
  /** The 32-octet private scalar. */
  privateKey: string;
}

/**
 * The demo's VAPID keys: made at first start and kept in `dir/vapid.json` (mode 0600), so that
 * browsers subscribed in one run can still be reached in the next. Production passes its keys
 * through the environment instead.
 *
 * A damaged file is an error, never a reason to make new keys: every subscription is bound to the
 * public key it was created with (RFC 8292 §4), so new keys would silently orphan all of them.
 */
export function loadOrCreateVapidKeys(dir: string): Promise<VapidKeys> {
  return loadOrCreatePrivateJson(dir, 'vapid.json', () => webpush.generateVAPIDKeys(), parseVapidKeys);
}

function parseVapidKeys(text: string, path: string): VapidKeys {
  let keys: unknown;
  try {
    keys = JSON.parse(text);
  } catch {
    throw new Error(`${path} is not JSON. Restore it, or delete it to make new VAPID keys.`);
  }
  const { publicKey, privateKey } = (keys ?? {}) as Partial<Record<keyof VapidKeys, unknown>>;
  if (typeof publicKey !== 'string' || typeof privateKey !== 'string' || !keysMatch(publicKey, privateKey)) {
    throw new Error(
      `${path} does not hold a matching P-256 key pair (publicKey, privateKey in base64url). ` +
        'Restore it, or delete it to make new VAPID keys (existing push subscriptions will stop working).',
    );
  }
  return { publicKey, privateKey };
}

function keysMatch(publicKey: string, privateKey: string): boolean {
  const scalar = Buffer.from(privateKey, 'base64url');
  if (scalar.length !== 32) return false;
  try {
    const pair = createECDH('prime256v1');
    pair.setPrivateKey(scalar);
    return pair.getPublicKey('base64url') === publicKey;
  } catch {
    return false;
  }
}

/*
 * This device's side of web push: the browser's push subscription, held by the service worker
 * (registered in web/lib/service-worker.ts). Nothing here talks to the Brinewatch API.
 */

export type PushAvailability = 'available' | 'unsupported' | 'insecure';

export function pushAvailability(): PushAvailability {
  if (!window.isSecureContext) return 'insecure';
  if (!('serviceWorker' in navigator) || !('PushManager' in window) || !('Notification' in window)) {
    return 'unsupported';
  }
  return 'available';
}

/** A VAPID public key arrives as base64url; the push manager wants its bytes. */
export function keyBytes(base64url: string): Uint8Array<ArrayBuffer> {
  const base64 = base64url.replace(/-/g, '+').replace(/_/g, '/');
  const binary = atob(base64.padEnd(Math.ceil(base64.length / 4) * 4, '='));
  const bytes = new Uint8Array(new ArrayBuffer(binary.length));
  for (let i = 0; i < binary.length; i += 1) bytes[i] = binary.charCodeAt(i);
  return bytes;
}

function sameKey(current: ArrayBuffer | null, wanted: Uint8Array): boolean {
  if (!current) return false;
  const bytes = new Uint8Array(current);
  return bytes.length === wanted.length && bytes.every((byte, i) => byte === wanted[i]);
}

export type PushSetupProblem = 'blocked' | 'dismissed' | 'no-key' | 'browser-refused';

export class PushSetupError extends Error {
  constructor(readonly problem: PushSetupProblem) {
    super(`web push set-up failed: ${problem}`);
    this.name = 'PushSetupError';
  }
}

/**
 * This browser's subscription for the server's key: the existing one when it matches, else a new
 * one (a subscription made for an older key has to go first, or the browser refuses).
 */
export async function subscribeThisDevice(publicKey: string): Promise<PushSubscription> {
  const registration = await navigator.serviceWorker.ready;
  const key = keyBytes(publicKey);
  try {
    const existing = await registration.pushManager.getSubscription();
    if (existing && sameKey(existing.options.applicationServerKey, key)) return existing;
    await existing?.unsubscribe();
    return await registration.pushManager.subscribe({ userVisibleOnly: true, applicationServerKey: key });
  } catch (error) {
    // NotAllowedError: permission withdrawn; AbortError and others: no push service reachable.
    throw new PushSetupError(
      error instanceof DOMException && error.name === 'NotAllowedError' ? 'blocked' : 'browser-refused',
    );
  }
}

export async function currentSubscription(): Promise<PushSubscription | null> {
  const registration = await navigator.serviceWorker.getRegistration('/');
  return (await registration?.pushManager.getSubscription()) ?? null;
}

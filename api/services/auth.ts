import type { Request } from 'express';
import { depsOf } from '../deps';
import { appOrigin } from '../env';
import { SignInRefused, type VerifiedIdentity } from '../lib/oidc-client';
import { acceptPendingInvitation } from './invitations';
import { findUserByIdentity } from './users';

/** Only a path inside the app: no scheme, no host, no protocol-relative `//` (RFC 9700 §4.11). */
export function safeReturnTo(value: unknown): string {
  if (typeof value !== 'string' || !value.startsWith('/') || value.startsWith('//') || /[\\\s]/.test(value)) {
    return '/';
  }
  const url = new URL(value, 'http://app.invalid');
  if (url.origin !== 'http://app.invalid' || url.pathname.startsWith('/auth/')) return '/';
  return `${url.pathname}${url.search}${url.hash}`;
}

function promisify(run: (done: (error?: unknown) => void) => void): Promise<void> {
  return new Promise((resolve, reject) => run((error) => (error ? reject(error) : resolve())));
}

export const regenerateSession = (req: Request) => promisify((done) => req.session.regenerate(done));
export const destroySession = (req: Request) => promisify((done) => req.session.destroy(done));
const saveSession = (req: Request) => promisify((done) => req.session.save(done));

export async function beginSignIn(req: Request, returnTo: unknown): Promise<string> {
  const { oidc } = depsOf(req);
  const { url, pending } = await oidc.startLogin(safeReturnTo(returnTo));
  req.session.pendingLogin = pending;
  await saveSession(req);
  return url;
}

export type SignInOutcome =
  { kind: 'signed-in'; returnTo: string } | { kind: 'no-access' } | { kind: 'refused'; reason: string };

/**
 * The callback: the pending state and nonce are taken out of the session before anything
 * else, so they are accepted once; the session id changes at sign-in (OWASP ASVS V7).
 */
export async function completeSignIn(req: Request): Promise<SignInOutcome> {
  const deps = depsOf(req);
  const pending = req.session.pendingLogin;
  const invitationHash = req.session.pendingInvitation;
  delete req.session.pendingLogin;
  delete req.session.pendingInvitation;
  if (!pending) {
    await saveSession(req);
    return { kind: 'refused', reason: 'This sign-in link has already been used or has expired.' };
  }
  const callbackUrl = new URL(req.originalUrl, appOrigin(deps.env));
  let identity: VerifiedIdentity;
  try {
    identity = await deps.oidc.finishLogin(callbackUrl, pending);
  } catch (error) {
    await saveSession(req);
    if (error instanceof SignInRefused) {
      req.log.warn({ reason: error.reason }, 'sign-in refused');
      return { kind: 'refused', reason: 'The sign-in could not be verified. Please try again.' };
    }
    throw error;
  }

  const now = deps.clock();
  let user = await findUserByIdentity(deps.db, identity.issuer, identity.subject);
  if (invitationHash) {
    user = (await acceptPendingInvitation(deps, invitationHash, identity, user, now)) ?? user;
  }
  await regenerateSession(req);
  if (!user || user.status !== 'active') {
    req.session.noAccess = {
      email: identity.email,
      name: identity.name,
      reason: user ? 'deactivated' : invitationHash ? 'invitation-invalid' : 'not-invited',
    };
    await saveSession(req);
    return { kind: 'no-access' };
  }
  req.session.userId = user.id;
  req.session.signedInAt = now.getTime();
  req.session.lastSeenAt = now.getTime();
  req.session.idToken = identity.idToken;
  await saveSession(req);
  // Someone who came in through the front door goes to their own start page.
  const home = user.role === 'owner' ? '/tanks' : '/console';
  return { kind: 'signed-in', returnTo: pending.returnTo === '/' ? home : pending.returnTo };
}

/** Ends our session first, then hands the browser to the provider's end_session endpoint. */
export async function signOut(req: Request): Promise<string> {
  const { oidc } = depsOf(req);
  const idToken = req.session.idToken;
  await destroySession(req);
  return oidc.endSessionUrl(idToken);
}

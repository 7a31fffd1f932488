import type { SessionData } from 'express-session';
import type { AppDeps } from '../deps';
import type { Logger } from '../lib/logger';
import { SignInRefused, type OidcClient, type PendingLogin, type VerifiedIdentity } from '../lib/oidc-client';
import { recordAudit, type AuditSource } from './audit';
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

/** Where to send the browser, and the state to keep in the pre-login session until it returns. */
export function beginSignIn(
  oidc: OidcClient,
  returnTo: unknown,
): Promise<{ url: string; pending: PendingLogin }> {
  return oidc.startLogin(safeReturnTo(returnTo));
}

/** What a signed-in session holds; the idle and absolute limits start at sign-in. */
export type SignedInSession = Pick<SessionData, 'userId' | 'signedInAt' | 'lastSeenAt' | 'idToken'>;

export type SignInOutcome =
  | { kind: 'signed-in'; returnTo: string; session: SignedInSession }
  | { kind: 'no-access'; noAccess: SessionData['noAccess'] }
  | { kind: 'refused'; reason: string };

/**
 * The callback. The caller removes the pre-login cookie (state, nonce, PKCE verifier) first,
 * and the provider redeems a code once, and gives the session a new id at sign-in (OWASP ASVS V7).
 * Outcomes for a person of a company go to its audit trail; a refusal that belongs to no company
 * (an unverifiable token, an identity nobody invited) goes to the log (OWASP ASVS 5.0 V16).
 */
export async function completeSignIn(
  deps: AppDeps,
  log: Logger,
  callback: { url: URL; pending: PendingLogin | undefined; invitationHash: string | undefined },
  source: AuditSource,
): Promise<SignInOutcome> {
  const { pending, invitationHash } = callback;
  if (!pending) return { kind: 'refused', reason: 'This sign-in link has already been used or has expired.' };
  let identity: VerifiedIdentity;
  try {
    identity = await deps.oidc.finishLogin(callback.url, pending);
  } catch (error) {
    if (error instanceof SignInRefused) {
      log.warn({ reason: error.reason, ip: source.ip }, 'sign-in refused');
      return { kind: 'refused', reason: 'The sign-in could not be verified. Please try again.' };
    }
    throw error;
  }

  const now = source.at;
  let user = await findUserByIdentity(deps.db, identity.issuer, identity.subject);
  if (invitationHash) {
    user = (await acceptPendingInvitation(deps, invitationHash, identity, user, source)) ?? user;
  }
  if (!user || user.status !== 'active') {
    const reason = user ? 'deactivated' : invitationHash ? 'invitation-invalid' : 'not-invited';
    if (user) {
      await recordAudit(deps.db, {
        companyId: user.companyId,
        actor: user,
        action: 'sign-in.failed',
        details: { reason },
        source,
      });
    } else {
      log.warn(
        { reason, issuer: identity.issuer, subject: identity.subject, ip: source.ip },
        'sign-in refused',
      );
    }
    return {
      kind: 'no-access',
      noAccess: {
        email: identity.email,
        name: identity.name,
        reason,
      },
    };
  }
  await recordAudit(deps.db, { companyId: user.companyId, actor: user, action: 'sign-in.succeeded', source });
  // Someone who came in through the front door goes to their own start page.
  const home = user.role === 'owner' ? '/tanks' : '/console';
  return {
    kind: 'signed-in',
    returnTo: pending.returnTo === '/' ? home : pending.returnTo,
    session: {
      userId: user.id,
      signedInAt: now.getTime(),
      lastSeenAt: now.getTime(),
      idToken: identity.idToken,
    },
  };
}

import { Router } from 'express';
import { z } from 'zod';
import { appOrigin } from '../env';
import type { AppDeps } from '../deps';
import {
  createPreLoginSeal,
  preLoginCookieName,
  preLoginMaxAgeS,
  readCookie,
  type PreLogin,
} from '../lib/pre-login-cookie';
import { openRoute, redirect, type OpenContext } from '../lib/route';
import { hashToken } from '../lib/tokens';
import { perIp, rateLimit } from '../middleware/rate-limit';
import { destroySession, isHttps, regenerateSession, saveSession } from '../middleware/session';
import { publicRoute } from '../policy/index';
import { auditSourceOf } from '../services/audit';
import { beginSignIn, completeSignIn } from '../services/auth';
import { findOpenInvitation } from '../services/invitations';

/** Browser-facing sign-in routes (not under /api: they answer with redirects). */
export const authRouter = Router();

// safeReturnTo judges the value itself, whatever its shape, so nothing here may refuse it.
const signInQuery = z.object({ returnTo: z.unknown().optional() });
const invitationParams = z.object({ token: z.string().min(20).max(100) });

/**
 * Per client address (OWASP ASVS 5.0 V2 anti-automation). A start costs no storage now (see
 * lib/pre-login-cookie.ts), but each one still asks the provider for a page; 20 in 10 minutes
 * covers an office signing in behind one address (common practice).
 */
export const signInStartLimit = { points: 20, durationS: 10 * 60 } as const;
/** Invitation links are 256-bit tokens, so this is about load, not guessing (common practice). */
export const invitationOpenLimit = { points: 20, durationS: 10 * 60 } as const;

const limitSignInStarts = rateLimit({
  name: 'sign-in-start',
  ...signInStartLimit,
  points: (env) => env.SIGN_IN_STARTS_PER_10_MIN,
  keyOf: perIp,
  message: (retryAfterS) => `Too many sign-in attempts from this address. Try again in ${retryAfterS} s.`,
});
const limitInvitationOpens = rateLimit({
  name: 'invitation-open',
  ...invitationOpenLimit,
  keyOf: perIp,
  message: (retryAfterS) =>
    `Too many invitation links opened from this address. Try again in ${retryAfterS} s.`,
});

authRouter.get('/login', publicRoute, limitSignInStarts, openRoute({ query: signInQuery }, startSignIn));
authRouter.get('/callback', publicRoute, openRoute({}, finishSignIn));
authRouter.post('/logout', publicRoute, openRoute({}, endSession));
authRouter.get(
  '/invitation/:token',
  publicRoute,
  limitInvitationOpens,
  openRoute({ params: invitationParams }, openInvitation),
);

/** The pre-login cookie's Set-Cookie line: `value` sealed, or null to remove it. */
function preLoginCookie(deps: AppDeps, value: PreLogin | null) {
  const secure = isHttps(deps.env);
  const attributes = `Path=/; HttpOnly; SameSite=Lax${secure ? '; Secure' : ''}`;
  const name = preLoginCookieName(secure);
  if (!value) return `${name}=; ${attributes}; Max-Age=0; Expires=Thu, 01 Jan 1970 00:00:00 GMT`;
  const sealed = createPreLoginSeal(deps.env.SESSION_SECRET.split(',')).seal(value, deps.clock());
  return `${name}=${sealed}; ${attributes}; Max-Age=${preLoginMaxAgeS}`;
}

function readPreLogin({ deps, header }: Pick<OpenContext<object>, 'deps' | 'header'>): PreLogin | null {
  const sealed = readCookie(header('cookie'), preLoginCookieName(isHttps(deps.env)));
  return createPreLoginSeal(deps.env.SESSION_SECRET.split(',')).open(sealed, deps.clock());
}

/** No session row yet: the state, nonce and PKCE verifier wait in the pre-login cookie. */
async function startSignIn(ctx: OpenContext<{ query: typeof signInQuery }>) {
  const { deps, query } = ctx;
  const { url, pending } = await beginSignIn(deps.oidc, query.returnTo);
  const invitationHash = readPreLogin(ctx)?.invitationHash;
  ctx.setHeader('Set-Cookie', preLoginCookie(deps, { login: pending, invitationHash }));
  return redirect(url);
}

/**
 * The pre-login cookie goes before anything else is done; the provider redeems a code once
 * (RFC 6749 §4.1.2), so a callback replayed with a copied cookie is refused there.
 */
async function finishSignIn(ctx: OpenContext<object>) {
  const { deps, log } = ctx;
  const preLogin = readPreLogin(ctx);
  ctx.setHeader('Set-Cookie', preLoginCookie(deps, null));
  const url = new URL(ctx.originalUrl, appOrigin(deps.env));
  const outcome = await completeSignIn(
    deps,
    log,
    { url, pending: preLogin?.login, invitationHash: preLogin?.invitationHash },
    auditSourceOf(ctx),
  );
  if (outcome.kind === 'refused') return redirect('/sign-in-problem');
  await regenerateSession(ctx.session);
  if (outcome.kind === 'no-access') {
    ctx.session.noAccess = outcome.noAccess;
    await saveSession(ctx.session);
    return redirect('/no-access');
  }
  Object.assign(ctx.session, outcome.session);
  await saveSession(ctx.session);
  return redirect(outcome.returnTo);
}

/** Ends our session first, then hands the browser to the provider's end_session endpoint. */
async function endSession({ deps, session }: OpenContext<object>) {
  const idToken = session.idToken;
  await destroySession(session);
  return { redirectTo: await deps.oidc.endSessionUrl(idToken) };
}

/** The link in an invitation e-mail: remember it in the pre-login cookie, then sign in. */
async function openInvitation({ deps, params, setHeader }: OpenContext<{ params: typeof invitationParams }>) {
  if (!(await findOpenInvitation(deps.db, params.token, deps.clock())))
    return redirect('/invitation-invalid');
  setHeader('Set-Cookie', preLoginCookie(deps, { invitationHash: hashToken(params.token) }));
  return redirect('/auth/login');
}

import { Router } from 'express';
import { z } from 'zod';
import { appOrigin } from '../env';
import { openRoute, redirect, type OpenContext } from '../lib/route';
import { hashToken } from '../lib/tokens';
import { destroySession, regenerateSession, saveSession } from '../middleware/session';
import { publicRoute } from '../policy/index';
import { beginSignIn, completeSignIn } from '../services/auth';
import { findOpenInvitation } from '../services/invitations';

/** Browser-facing sign-in routes (not under /api: they answer with redirects). */
export const authRouter = Router();

// safeReturnTo judges the value itself, whatever its shape, so nothing here may refuse it.
const signInQuery = z.object({ returnTo: z.unknown().optional() });
const invitationParams = z.object({ token: z.string().min(20).max(100) });

authRouter.get('/login', publicRoute, openRoute({ query: signInQuery }, startSignIn));
authRouter.get('/callback', publicRoute, openRoute({}, finishSignIn));
authRouter.post('/logout', publicRoute, openRoute({}, endSession));
authRouter.get('/invitation/:token', publicRoute, openRoute({ params: invitationParams }, openInvitation));

async function startSignIn({ deps, query, session }: OpenContext<{ query: typeof signInQuery }>) {
  const { url, pending } = await beginSignIn(deps.oidc, query.returnTo);
  session.pendingLogin = pending;
  await saveSession(session);
  return redirect(url);
}

/** The pending state and nonce leave the session before anything else, so they are accepted once. */
async function finishSignIn(ctx: OpenContext<object>) {
  const { deps, log } = ctx;
  const pending = ctx.session.pendingLogin;
  const invitationHash = ctx.session.pendingInvitation;
  delete ctx.session.pendingLogin;
  delete ctx.session.pendingInvitation;
  const url = new URL(ctx.originalUrl, appOrigin(deps.env));
  const outcome = await completeSignIn(deps, log, { url, pending, invitationHash }).catch(
    async (error: unknown) => {
      await saveSession(ctx.session);
      throw error;
    },
  );
  if (outcome.kind === 'refused') {
    await saveSession(ctx.session);
    return redirect('/sign-in-problem');
  }
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

/** The link in an invitation e-mail: remember it in the pre-login session, then sign in. */
async function openInvitation({ deps, params, session }: OpenContext<{ params: typeof invitationParams }>) {
  if (!(await findOpenInvitation(deps.db, params.token, deps.clock())))
    return redirect('/invitation-invalid');
  session.pendingInvitation = hashToken(params.token);
  return redirect('/auth/login');
}

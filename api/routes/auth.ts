import { Router, type Request, type Response } from 'express';
import { z } from 'zod';
import { depsOf } from '../deps';
import { hashToken } from '../lib/tokens';
import { parsed, validate } from '../middleware/validate';
import { publicRoute } from '../policy/index';
import { beginSignIn, completeSignIn, signOut } from '../services/auth';
import { findOpenInvitation } from '../services/invitations';

/** Browser-facing sign-in routes (not under /api: they answer with redirects). */
export const authRouter = Router();

const invitationParams = z.object({ token: z.string().min(20).max(100) });

authRouter.get('/login', publicRoute, startSignIn);
authRouter.get('/callback', publicRoute, finishSignIn);
authRouter.post('/logout', publicRoute, endSession);
authRouter.get('/invitation/:token', publicRoute, validate({ params: invitationParams }), openInvitation);

async function startSignIn(req: Request, res: Response) {
  res.redirect(303, await beginSignIn(req, req.query.returnTo));
}

async function finishSignIn(req: Request, res: Response) {
  const outcome = await completeSignIn(req);
  if (outcome.kind === 'signed-in') return res.redirect(303, outcome.returnTo);
  res.redirect(303, outcome.kind === 'no-access' ? '/no-access' : '/sign-in-problem');
}

async function endSession(req: Request, res: Response) {
  res.json({ redirectTo: await signOut(req) });
}

/** The link in an invitation e-mail: remember it in the pre-login session, then sign in. */
async function openInvitation(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  const { token } = parsed(res, 'params', invitationParams);
  if (!(await findOpenInvitation(db, token, clock()))) return res.redirect(303, '/invitation-invalid');
  req.session.pendingInvitation = hashToken(token);
  res.redirect(303, '/auth/login');
}

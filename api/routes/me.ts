import { Router, type Request, type Response } from 'express';
import { can, publicRoute, requireActor } from '../policy/index';

export const meRouter = Router();

meRouter.get('/', can('me:read'), getMe);
meRouter.get('/access', publicRoute, getAccess);

function getMe(req: Request, res: Response) {
  const actor = requireActor(req.actor);
  res.json({
    id: actor.id,
    name: actor.name,
    email: actor.email,
    role: actor.role,
    company: { id: actor.companyId, name: actor.companyName },
  });
}

/** What the "no access yet" page shows: who signed in without an invitation. */
function getAccess(req: Request, res: Response) {
  res.json({ signedIn: Boolean(req.actor), noAccess: req.session.noAccess ?? null });
}

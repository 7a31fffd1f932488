import { Router } from 'express';
import { openRoute, route } from '../lib/route';
import { can, publicRoute } from '../policy/index';

export const meRouter = Router();

meRouter.get(
  '/',
  can('me:read'),
  route({}, ({ actor }) => ({
    id: actor.id,
    name: actor.name,
    email: actor.email,
    role: actor.role,
    company: { id: actor.companyId, name: actor.companyName },
  })),
);
/** What the "no access yet" page shows: who signed in without an invitation. */
meRouter.get(
  '/access',
  publicRoute,
  // A session ended on this request (deactivated, expired) is gone by now: nothing to tell.
  openRoute({}, ({ actor, session }) => ({
    signedIn: Boolean(actor),
    noAccess: (session as typeof session | undefined)?.noAccess ?? null,
  })),
);

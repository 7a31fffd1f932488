import { Router } from 'express';
import { createInvitationInput, invitationIdParams } from '@shared/schemas/invitations';
import { appOrigin } from '../env';
import { created, noContent, route } from '../lib/route';
import { can } from '../policy/index';
import { createInvitation, listInvitations, revokeInvitation } from '../services/invitations';

export const invitationsRouter = Router();

invitationsRouter.get(
  '/',
  can('invitations:manage'),
  route({}, ({ deps, actor }) => listInvitations(deps.db, actor, deps.clock())),
);
invitationsRouter.post(
  '/',
  can('invitations:manage'),
  route({ body: createInvitationInput }, async ({ deps, actor, body }) =>
    created(await createInvitation(deps, actor, body, appOrigin(deps.env))),
  ),
);
invitationsRouter.delete(
  '/:invitationId',
  can('invitations:manage'),
  route({ params: invitationIdParams }, async ({ deps, actor, params }) => {
    await revokeInvitation(deps.db, actor, params.invitationId, deps.clock());
    return noContent();
  }),
);

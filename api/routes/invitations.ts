import { Router } from 'express';
import { createInvitationInput, invitationIdParams } from '@shared/schemas/invitations';
import { appOrigin } from '../env';
import { created, noContent, route } from '../lib/route';
import { can } from '../policy/index';
import { auditSourceOf } from '../services/audit';
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
  route({ body: createInvitationInput }, async (ctx) =>
    created(
      await createInvitation(ctx.deps, ctx.actor, ctx.body, appOrigin(ctx.deps.env), auditSourceOf(ctx)),
    ),
  ),
);
invitationsRouter.delete(
  '/:invitationId',
  can('invitations:manage'),
  route({ params: invitationIdParams }, async (ctx) => {
    await revokeInvitation(ctx.deps.db, ctx.actor, ctx.params.invitationId, auditSourceOf(ctx));
    return noContent();
  }),
);

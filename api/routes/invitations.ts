import { Router, type Request, type Response } from 'express';
import { createInvitationInput, invitationIdParams } from '@shared/schemas/invitations';
import { depsOf } from '../deps';
import { appOrigin } from '../env';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import { createInvitation, listInvitations, revokeInvitation } from '../services/invitations';

export const invitationsRouter = Router();

invitationsRouter.get('/', can('invitations:manage'), getInvitations);
invitationsRouter.post(
  '/',
  can('invitations:manage'),
  validate({ body: createInvitationInput }),
  postInvitation,
);
invitationsRouter.delete(
  '/:invitationId',
  can('invitations:manage'),
  validate({ params: invitationIdParams }),
  deleteInvitation,
);

async function getInvitations(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  res.json(await listInvitations(db, requireActor(req.actor), clock()));
}

async function postInvitation(req: Request, res: Response) {
  const deps = depsOf(req);
  const input = parsed(res, 'body', createInvitationInput);
  res.status(201).json(await createInvitation(deps, requireActor(req.actor), input, appOrigin(deps.env)));
}

async function deleteInvitation(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  const { invitationId } = parsed(res, 'params', invitationIdParams);
  await revokeInvitation(db, requireActor(req.actor), invitationId, clock());
  res.status(204).end();
}

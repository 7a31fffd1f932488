import { Router, type Request, type Response } from 'express';
import {
  acknowledgeInput,
  alertIdParams,
  alertListQuery,
  markReadInput,
  resolveInput,
} from '@shared/schemas/alerts';
import { notificationPreferences, pushSubscriptionInput } from '@shared/schemas/notifications';
import { z } from 'zod';
import { depsOf } from '../deps';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import { acknowledgeAlert, getAlert, listAlerts, resolveAlert } from '../services/alerts';
import {
  deletePushSubscription,
  getPreferences,
  listNotifications,
  markNotificationsRead,
  savePreferences,
  savePushSubscription,
} from '../services/notifications';
import { streamEvents } from '../services/event-stream';

export const alertsRouter = Router();
export const notificationsRouter = Router();
export const pushRouter = Router();
export const eventsRouter = Router();

const unsubscribeInput = z.object({ endpoint: z.url() });

alertsRouter.get('/', can('alerts:read'), validate({ query: alertListQuery }), getAlerts);
alertsRouter.get('/:alertId', can('alerts:read'), validate({ params: alertIdParams }), getOneAlert);
alertsRouter.post(
  '/:alertId/acknowledge',
  can('alerts:manage'),
  validate({ params: alertIdParams, body: acknowledgeInput }),
  postAcknowledge,
);
alertsRouter.post(
  '/:alertId/resolve',
  can('alerts:manage'),
  validate({ params: alertIdParams, body: resolveInput }),
  postResolve,
);
notificationsRouter.get('/', can('notifications:own'), getNotifications);
notificationsRouter.post('/read', can('notifications:own'), validate({ body: markReadInput }), postRead);
notificationsRouter.get('/preferences', can('notifications:own'), getMyPreferences);
notificationsRouter.put(
  '/preferences',
  can('notifications:own'),
  validate({ body: notificationPreferences }),
  putPreferences,
);
pushRouter.get('/public-key', can('notifications:own'), getPublicKey);
pushRouter.post(
  '/subscriptions',
  can('notifications:own'),
  validate({ body: pushSubscriptionInput }),
  postSubscription,
);
pushRouter.delete(
  '/subscriptions',
  can('notifications:own'),
  validate({ body: unsubscribeInput }),
  deleteSubscription,
);
eventsRouter.get('/', can('notifications:own'), getEvents);

async function getAlerts(req: Request, res: Response) {
  res.json(await listAlerts(depsOf(req).db, requireActor(req.actor), parsed(res, 'query', alertListQuery)));
}

async function getOneAlert(req: Request, res: Response) {
  const { alertId } = parsed(res, 'params', alertIdParams);
  res.json(await getAlert(depsOf(req).db, requireActor(req.actor), alertId));
}

async function postAcknowledge(req: Request, res: Response) {
  const { alertId } = parsed(res, 'params', alertIdParams);
  const { note } = parsed(res, 'body', acknowledgeInput);
  const { alert } = await acknowledgeAlert(depsOf(req), requireActor(req.actor), alertId, note);
  res.json(alert);
}

async function postResolve(req: Request, res: Response) {
  const { alertId } = parsed(res, 'params', alertIdParams);
  const { note } = parsed(res, 'body', resolveInput);
  res.json(await resolveAlert(depsOf(req), requireActor(req.actor), alertId, note));
}

async function getNotifications(req: Request, res: Response) {
  res.json(await listNotifications(depsOf(req).db, requireActor(req.actor)));
}

async function postRead(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  const { ids } = parsed(res, 'body', markReadInput);
  await markNotificationsRead(db, requireActor(req.actor), clock(), ids);
  res.status(204).end();
}

async function getMyPreferences(req: Request, res: Response) {
  res.json(await getPreferences(depsOf(req).db, requireActor(req.actor)));
}

async function putPreferences(req: Request, res: Response) {
  res.json(
    await savePreferences(
      depsOf(req).db,
      requireActor(req.actor),
      parsed(res, 'body', notificationPreferences),
    ),
  );
}

function getPublicKey(req: Request, res: Response) {
  const key = depsOf(req).env.VAPID_PUBLIC_KEY ?? null;
  res.json({ publicKey: key });
}

async function postSubscription(req: Request, res: Response) {
  const input = parsed(res, 'body', pushSubscriptionInput);
  const userAgent = req.get('user-agent')?.slice(0, 300);
  res.status(201).json(await savePushSubscription(depsOf(req).db, requireActor(req.actor), input, userAgent));
}

async function deleteSubscription(req: Request, res: Response) {
  const { endpoint } = parsed(res, 'body', unsubscribeInput);
  await deletePushSubscription(depsOf(req).db, requireActor(req.actor), endpoint);
  res.status(204).end();
}

function getEvents(req: Request, res: Response) {
  streamEvents(req, res, requireActor(req.actor));
}

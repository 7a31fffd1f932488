import { Router } from 'express';
import {
  acknowledgeInput,
  alertIdParams,
  alertListQuery,
  markReadInput,
  resolveInput,
} from '@shared/schemas/alerts';
import { notificationPreferences, pushSubscriptionInput } from '@shared/schemas/notifications';
import { z } from 'zod';
import { created, eventStream, noContent, route } from '../lib/route';
import { can } from '../policy/index';
import { acknowledgeAlert, getAlert, listAlerts, resolveAlert } from '../services/alerts';
import { subscribeToEvents } from '../services/event-stream';
import {
  deletePushSubscription,
  getPreferences,
  listNotifications,
  markNotificationsRead,
  savePreferences,
  savePushSubscription,
} from '../services/notifications';

export const alertsRouter = Router();
export const notificationsRouter = Router();
export const pushRouter = Router();
export const eventsRouter = Router();

const unsubscribeInput = z.object({ endpoint: z.url().max(2048) });

alertsRouter.get(
  '/',
  can('alerts:read'),
  route({ query: alertListQuery }, ({ deps, actor, query }) => listAlerts(deps.db, actor, query)),
);
alertsRouter.get(
  '/:alertId',
  can('alerts:read'),
  route({ params: alertIdParams }, ({ deps, actor, params }) => getAlert(deps.db, actor, params.alertId)),
);
alertsRouter.post(
  '/:alertId/acknowledge',
  can('alerts:manage'),
  route(
    { params: alertIdParams, body: acknowledgeInput },
    async ({ deps, actor, params, body }) =>
      (await acknowledgeAlert(deps, actor, params.alertId, body.note)).alert,
  ),
);
alertsRouter.post(
  '/:alertId/resolve',
  can('alerts:manage'),
  route({ params: alertIdParams, body: resolveInput }, ({ deps, actor, params, body }) =>
    resolveAlert(deps, actor, params.alertId, body.note),
  ),
);

notificationsRouter.get(
  '/',
  can('notifications:own'),
  route({}, ({ deps, actor }) => listNotifications(deps.db, actor)),
);
notificationsRouter.post(
  '/read',
  can('notifications:own'),
  route({ body: markReadInput }, async ({ deps, actor, body }) => {
    await markNotificationsRead(deps.db, actor, deps.clock(), body.ids);
    return noContent();
  }),
);
notificationsRouter.get(
  '/preferences',
  can('notifications:own'),
  route({}, ({ deps, actor }) => getPreferences(deps.db, actor)),
);
notificationsRouter.put(
  '/preferences',
  can('notifications:own'),
  route({ body: notificationPreferences }, ({ deps, actor, body }) => savePreferences(deps.db, actor, body)),
);

pushRouter.get(
  '/public-key',
  can('notifications:own'),
  route({}, ({ deps }) => ({ publicKey: deps.env.VAPID_PUBLIC_KEY ?? null })),
);
pushRouter.post(
  '/subscriptions',
  can('notifications:own'),
  route({ body: pushSubscriptionInput }, async ({ deps, actor, body, header }) =>
    created(await savePushSubscription(deps.db, actor, body, header('user-agent')?.slice(0, 300))),
  ),
);
pushRouter.delete(
  '/subscriptions',
  can('notifications:own'),
  route({ body: unsubscribeInput }, async ({ deps, actor, body }) => {
    await deletePushSubscription(deps.db, actor, body.endpoint);
    return noContent();
  }),
);

eventsRouter.get(
  '/',
  can('notifications:own'),
  route({}, ({ deps, actor }) => eventStream((send) => subscribeToEvents(deps, actor, send))),
);

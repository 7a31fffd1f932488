import type { Router } from 'express';
import { alertsRouter, eventsRouter, notificationsRouter, pushRouter } from './alerts';
import { auditRouter } from './audit';
import { billingRouter } from './billing';
import { invoicesRouter, paymentWebhookRouter, paymentsRouter } from './invoices';
import { careTipsRouter, tankTipSuggestionsRouter } from './care-tips';
import { conversationsRouter, tankConversationRouter } from './conversations';
import { calendarFeedRouter, calendarRouter } from './calendar';
import { devicesRouter } from './devices';
import { healthRouter } from './health';
import { ingestRouter } from './ingest';
import { invitationsRouter } from './invitations';
import { limitsRouter } from './limits';
import { meRouter } from './me';
import { deliveriesRouter, onCallRouter } from './on-call';
import { equipmentRouter } from './equipment';
import { livestockRouter } from './livestock';
import { photosRouter, tankPhotosRouter } from './photos';
import { readingsRouter } from './readings';
import { speciesRouter } from './species';
import { clientsRouter, staffRouter, usersRouter } from './staff';
import { tanksRouter } from './tanks';
import { timelineRouter } from './timeline';
import { tankVisitsRouter, visitsRouter } from './visits';
import { tankUrgentRequestsRouter, urgentRequestsRouter, urgentSettingsRouter } from './urgent-requests';

/**
 * Answer before sessions are read: health still answers when the session store cannot, and
 * device ingest authenticates by bearer token, never by cookie (so no session or CSRF check); a
 * calendar feed, by the secret in its address; the payment provider's webhook, by its signature.
 */
export const sessionlessRouters: ReadonlyArray<readonly [string, Router]> = [
  ['/health', healthRouter],
  ['/ingest', ingestRouter],
  ['/calendar', calendarRouter],
  ['/payments/webhook', paymentWebhookRouter],
];

/** Where the payment provider posts its signed events (its raw body is kept for the signature). */
export const paymentWebhookPath = '/payments/webhook';

/** Every other API router and where it is mounted under /api. The route audit test walks both lists. */
export const apiRouters: ReadonlyArray<readonly [string, Router]> = [
  ['/me', meRouter],
  ['/billing', billingRouter],
  ['/invoices', invoicesRouter],
  ['/payments', paymentsRouter],
  ['/me/calendar-feed', calendarFeedRouter],
  ['/tanks', tanksRouter],
  ['/tanks/:tankId/equipment', equipmentRouter],
  ['/tanks/:tankId/livestock', livestockRouter],
  ['/tanks/:tankId/photos', tankPhotosRouter],
  ['/tanks/:tankId/readings', readingsRouter],
  ['/tanks/:tankId/limits', limitsRouter],
  ['/tanks/:tankId/devices', devicesRouter],
  ['/tanks/:tankId/visits', tankVisitsRouter],
  ['/tanks/:tankId/tip-suggestions', tankTipSuggestionsRouter],
  ['/tanks/:tankId/timeline', timelineRouter],
  ['/tanks/:tankId/conversation', tankConversationRouter],
  ['/visits', visitsRouter],
  ['/care-tips', careTipsRouter],
  ['/conversations', conversationsRouter],
  ['/photos', photosRouter],
  ['/species', speciesRouter],
  ['/staff', staffRouter],
  ['/clients', clientsRouter],
  ['/users', usersRouter],
  ['/invitations', invitationsRouter],
  ['/alerts', alertsRouter],
  ['/notifications', notificationsRouter],
  ['/push', pushRouter],
  ['/events', eventsRouter],
  ['/on-call', onCallRouter],
  ['/deliveries', deliveriesRouter],
  ['/audit', auditRouter],
  ['/tanks/:tankId/urgent-requests', tankUrgentRequestsRouter],
  ['/urgent-requests', urgentRequestsRouter],
  ['/urgent-settings', urgentSettingsRouter],
];

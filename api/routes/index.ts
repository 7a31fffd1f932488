import type { Router } from 'express';
import { alertsRouter, eventsRouter, notificationsRouter, pushRouter } from './alerts';
import { healthRouter } from './health';
import { invitationsRouter } from './invitations';
import { meRouter } from './me';
import { equipmentRouter } from './equipment';
import { livestockRouter } from './livestock';
import { photosRouter, tankPhotosRouter } from './photos';
import { speciesRouter } from './species';
import { clientsRouter, staffRouter, usersRouter } from './staff';
import { tanksRouter } from './tanks';

/** Answers before sessions are read, so it still answers when the session store cannot. */
export const sessionlessRouters: ReadonlyArray<readonly [string, Router]> = [['/health', healthRouter]];

/** Every other API router and where it is mounted under /api. The route audit test walks both lists. */
export const apiRouters: ReadonlyArray<readonly [string, Router]> = [
  ['/me', meRouter],
  ['/tanks', tanksRouter],
  ['/tanks/:tankId/equipment', equipmentRouter],
  ['/tanks/:tankId/livestock', livestockRouter],
  ['/tanks/:tankId/photos', tankPhotosRouter],
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
];

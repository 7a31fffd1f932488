import type { Router } from 'express';
import { healthRouter } from './health';
import { invitationsRouter } from './invitations';
import { meRouter } from './me';
import { clientsRouter, staffRouter, usersRouter } from './staff';
import { tanksRouter } from './tanks';

/** Answers before sessions are read, so it still answers when the session store cannot. */
export const sessionlessRouters: ReadonlyArray<readonly [string, Router]> = [['/health', healthRouter]];

/** Every other API router and where it is mounted under /api. The route audit test walks both lists. */
export const apiRouters: ReadonlyArray<readonly [string, Router]> = [
  ['/me', meRouter],
  ['/tanks', tanksRouter],
  ['/staff', staffRouter],
  ['/clients', clientsRouter],
  ['/users', usersRouter],
  ['/invitations', invitationsRouter],
];

import { Router } from 'express';
import { calendarFeedParams } from '@shared/schemas/calendar-feed';
import { appOrigin } from '../env';
import { created, noContent, openRoute, Reply, route } from '../lib/route';
import { perIp, rateLimit } from '../middleware/rate-limit';
import { can, publicRoute } from '../policy/index';
import { calendarFeedStatus, calendarFor, issueCalendarFeed, revokeCalendarFeed } from '../services/calendar';

/** The signed-in person's own feed address: whether there is one, a new one, none. */
export const calendarFeedRouter = Router();

calendarFeedRouter.get(
  '/',
  can('calendar:own'),
  route({}, ({ deps, actor }) => calendarFeedStatus(deps.db, actor)),
);
calendarFeedRouter.post(
  '/',
  can('calendar:own'),
  route({}, async ({ deps, actor }) => created(await issueCalendarFeed(deps.db, actor, appOrigin(deps.env)))),
);
calendarFeedRouter.delete(
  '/',
  can('calendar:own'),
  route({}, async ({ deps, actor }) => {
    await revokeCalendarFeed(deps.db, actor);
    return noContent();
  }),
);

/**
 * The feed itself, mounted before the session middleware: calendar apps send no cookie, and the
 * secret in the address is the credential.
 */
export const calendarRouter = Router();

/**
 * Per client address. Tokens are 256 bits, so this is about load, not guessing: calendar apps poll
 * every few minutes to every few hours, and 120 in 10 minutes leaves room for an office of
 * subscribers behind one address (common practice).
 */
export const calendarFeedReadLimit = { points: 120, durationS: 10 * 60 } as const;

const limitFeedReads = rateLimit({
  name: 'calendar-feed',
  ...calendarFeedReadLimit,
  keyOf: perIp,
  message: (retryAfterS) => `Too many calendar requests from this address. Try again in ${retryAfterS} s.`,
});

calendarRouter.get(
  '/:token.ics',
  publicRoute,
  limitFeedReads,
  openRoute({ params: calendarFeedParams }, async ({ deps, params }) => {
    const ics = await calendarFor(deps.db, params.token, deps.clock(), appOrigin(deps.env));
    return new Reply((res) => {
      res.setHeader('Content-Type', 'text/calendar; charset=utf-8');
      res.setHeader('Cache-Control', 'private, max-age=300');
      res.send(ics);
    });
  }),
);

import { apiPaths, tankSummaryAlertStatus, tankSummaryTipLimit } from './api-paths';

/*
 * Which reads a page's first screen makes, known from its address alone, so the server can start
 * them from the HTML instead of after the bundle has loaded and run. Only reads that every viewer
 * of the page makes belong here: a preload nobody uses is a wasted request and a console warning.
 * Role-dependent reads (an owner's tank list in the header, the staff's urgent count) stay out.
 */

export interface FirstLoad {
  /** Full addresses, `/api` included, in the order the page asks for them. */
  reads: string[];
  /** The route's lazy module, by its source path as the build's manifest keys it; null if none is known. */
  module: string | null;
}

interface FirstLoadRoute {
  /** Segments; `:name` takes one id. */
  pattern: string;
  module: string;
  /** Open to signed-out visitors too; a guarded page sends them to sign in before it reads anything. */
  open?: boolean;
  reads?: (params: Readonly<Record<string, string>>, search: URLSearchParams) => string[];
}

const idPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export const firstLoadRoutes: readonly FirstLoadRoute[] = [
  { pattern: '/', module: 'web/app/routes/landing.tsx', open: true, reads: () => [apiPaths.health()] },
  { pattern: '/calculators', module: 'web/app/routes/calculators.tsx', open: true },
  { pattern: '/tanks', module: 'web/app/routes/tanks.tsx', reads: () => [apiPaths.tanks()] },
  {
    pattern: '/tanks/:tankId',
    module: 'web/app/routes/tank.tsx',
    reads: ({ tankId = '' }, search) => {
      const always = [
        apiPaths.tank(tankId),
        apiPaths.tankUrgentRequests(tankId),
        apiPaths.tankConversation(tankId),
        apiPaths.tankVisits(tankId),
      ];
      // The summary is the page without `?section=`; the other sections read what they show.
      const section = search.get('section');
      if (section !== null && section !== 'summary') return always;
      return [
        ...always,
        apiPaths.alerts({ tankId, status: tankSummaryAlertStatus }),
        apiPaths.latestReadings(tankId),
        apiPaths.tipFeed({ tankId, cursor: null, limit: tankSummaryTipLimit }),
      ];
    },
  },
  { pattern: '/console', module: 'web/app/routes/console.tsx' },
];

function match(pattern: string, pathname: string): Record<string, string> | null {
  const wanted = pattern.split('/').filter(Boolean);
  const given = pathname.split('/').filter(Boolean);
  if (wanted.length !== given.length) return null;
  const params: Record<string, string> = {};
  for (const [i, segment] of wanted.entries()) {
    const value = given[i]!;
    if (segment.startsWith(':')) {
      // Only an id can be named in a preload: anything else would be the page's own 404 to tell.
      if (!idPattern.test(value)) return null;
      params[segment.slice(1)] = value;
    } else if (segment !== value) return null;
  }
  return params;
}

/**
 * What to start for a page before its scripts run. Everyone's page asks who is signed in; someone
 * signed in also gets the header's unread messages and notifications.
 */
export function firstLoadFor(
  pathname: string,
  search: string,
  { signedIn }: { signedIn: boolean },
): FirstLoad {
  const reads = [apiPaths.me()];
  if (signedIn) reads.push(apiPaths.unreadMessages(), apiPaths.notifications());
  let module: string | null = null;
  for (const route of firstLoadRoutes) {
    const params = match(route.pattern, pathname);
    if (!params) continue;
    module = route.module;
    if (signedIn || route.open) reads.push(...(route.reads?.(params, new URLSearchParams(search)) ?? []));
    break;
  }
  return { reads: reads.map((path) => `/api${path}`), module };
}

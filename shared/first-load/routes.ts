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
  // The other pages: their module only. Their reads depend on the viewer's role or on state the
  // address does not carry (a filter, a draft), so they start when the module runs.
  ...modulesOnly(
    'web/app/routes/access-pages.tsx',
    ['/no-access', '/sign-in-problem', '/invitation-invalid'],
    {
      open: true,
    },
  ),
  ...modulesOnly('web/app/routes/tank-messages.tsx', ['/tanks/:tankId/messages']),
  ...modulesOnly('web/app/routes/urgent-new.tsx', ['/tanks/:tankId/urgent']),
  ...modulesOnly('web/app/routes/invoices.tsx', ['/invoices', '/invoices/:invoiceId']),
  ...modulesOnly('web/app/routes/urgent-request.tsx', ['/urgent/:requestId']),
  ...modulesOnly('web/app/routes/console-tank-new.tsx', ['/console/tanks/new']),
  ...modulesOnly('web/app/routes/console-tank-edit.tsx', ['/console/tanks/:tankId/edit']),
  ...modulesOnly('web/app/routes/console-tank-livestock.tsx', ['/console/tanks/:tankId/livestock']),
  ...modulesOnly('web/app/routes/console-tank-equipment.tsx', ['/console/tanks/:tankId/equipment']),
  ...modulesOnly('web/app/routes/console-schedule.tsx', ['/console/schedule']),
  ...modulesOnly('web/app/routes/console-tips.tsx', [
    '/console/tips',
    '/console/tips/new',
    '/console/tips/:tipId',
    '/console/tips/:tipId/edit',
  ]),
  ...modulesOnly('web/app/routes/console-clients.tsx', ['/console/clients']),
  ...modulesOnly('web/app/routes/alerts-board.tsx', ['/console/alerts']),
  ...modulesOnly('web/app/routes/console-urgent.tsx', ['/console/urgent']),
  ...modulesOnly('web/app/routes/console-urgent-settings.tsx', ['/console/urgent/settings']),
  ...modulesOnly('web/app/routes/console-invoices.tsx', [
    '/console/invoices',
    '/console/invoices/:invoiceId',
  ]),
  ...modulesOnly('web/app/routes/console-inbox.tsx', ['/console/inbox']),
  ...modulesOnly('web/app/routes/console-audit.tsx', ['/console/audit']),
  ...modulesOnly('web/app/routes/console-billing.tsx', ['/console/billing']),
  ...modulesOnly('web/app/routes/console-staff.tsx', ['/console/staff']),
  ...modulesOnly('web/app/routes/visit-report.tsx', ['/visits/:visitId']),
  ...modulesOnly('web/app/routes/settings-notifications.tsx', ['/settings/notifications']),
];

function modulesOnly(module: string, patterns: string[], options: { open?: boolean } = {}): FirstLoadRoute[] {
  return patterns.map((pattern) => ({ pattern, module, ...options }));
}

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

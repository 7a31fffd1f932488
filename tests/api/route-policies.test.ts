import type { Router } from 'express';
import { describe, expect, it } from 'vitest';
import type { PolicyMarked } from '../../api/policy/index';
import { authRouter } from '../../api/routes/auth';
import { apiRouters, sessionlessRouters } from '../../api/routes/index';

interface RouteLayer {
  route?: { path: string; methods: Record<string, boolean>; stack: { handle: PolicyMarked }[] };
}

function routesOf(prefix: string, router: Router) {
  return (router.stack as RouteLayer[]).flatMap((layer) => {
    if (!layer.route) return [];
    const policies = layer.route.stack.map((step) => step.handle.policy).filter(Boolean);
    return Object.keys(layer.route.methods).map((method) => ({
      route: `${method.toUpperCase()} ${prefix}${layer.route!.path === '/' ? '' : layer.route!.path}`,
      policies,
    }));
  });
}

const allRoutes = [
  ...[...sessionlessRouters, ...apiRouters].flatMap(([path, router]) => routesOf(`/api${path}`, router)),
  ...routesOf('/auth', authRouter),
];

/** The only routes anyone may call without signing in. */
const publicRoutes = [
  'GET /api/health',
  'GET /api/me/access',
  'GET /api/calendar/:token.ics',
  'POST /api/payments/webhook',
  'GET /auth/login',
  'GET /auth/callback',
  'POST /auth/logout',
  'GET /auth/invitation/:token',
];

/** Routes a device calls with its bearer token: not public, and never behind the session. */
const deviceRoutes = ['POST /api/ingest/readings'];

describe('route policies', () => {
  it('finds the registered routes', () => {
    expect(allRoutes.length).toBeGreaterThan(10);
  });

  it('gives every route exactly one policy', () => {
    const without = allRoutes.filter((r) => r.policies.length !== 1).map((r) => r.route);
    expect(without).toEqual([]);
  });

  it('keeps public routes to the allow-list', () => {
    const open = allRoutes.filter((r) => r.policies[0] === 'public').map((r) => r.route);
    expect(open.sort()).toEqual([...publicRoutes].sort());
  });

  it('keeps device-token routes to their allow-list, mounted where no session is read', () => {
    const device = allRoutes.filter((r) => r.policies[0] === 'device').map((r) => r.route);
    const sessionless = sessionlessRouters.flatMap(([path, router]) => routesOf(`/api${path}`, router));
    expect(device.sort()).toEqual([...deviceRoutes].sort());
    expect(deviceRoutes.every((route) => sessionless.some((r) => r.route === route))).toBe(true);
  });
});

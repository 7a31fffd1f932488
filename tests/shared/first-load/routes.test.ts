import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { firstLoadFor, firstLoadRoutes } from '@shared/first-load/routes';

const tipId = '3f0c2a9e-5b1d-4c7e-9a2f-6d8e1b4c0a7d';
const header = ['/api/me', '/api/conversations/unread', '/api/notifications'];

/** The lazy page modules the client's router imports, as the build's manifest names them. */
function routerModules(): string[] {
  const router = readFileSync('web/app/router.tsx', 'utf8');
  return [...new Set([...router.matchAll(/import\('\.\/routes\/([\w-]+)'\)/g)].map(([, name]) => name!))].map(
    (name) => `web/app/routes/${name}.tsx`,
  );
}

describe('first-load routes', () => {
  it('name a module preload for every page the router loads lazily (but the catch-all 404)', () => {
    const modules = routerModules();
    expect(modules.length).toBeGreaterThan(20);
    const known = new Set(firstLoadRoutes.map((route) => route.module));
    const missing = modules.filter((module) => !known.has(module) && !module.endsWith('/not-found.tsx'));
    expect(missing).toEqual([]);
  });

  it('name only modules that exist', () => {
    const absent = firstLoadRoutes.map((route) => route.module).filter((module) => !existsSync(module));
    expect(absent).toEqual([]);
  });

  it("give a page without reads of its own its module and the header's reads", () => {
    expect(firstLoadFor('/console/inbox', '', { signedIn: true })).toEqual({
      reads: header,
      module: 'web/app/routes/console-inbox.tsx',
    });
    expect(firstLoadFor('/console/inbox', '', { signedIn: false })).toEqual({
      reads: ['/api/me'],
      module: 'web/app/routes/console-inbox.tsx',
    });
  });

  it('tell a fixed segment from an id', () => {
    expect(firstLoadFor('/console/tips/new', '', { signedIn: true }).module).toBe(
      'web/app/routes/console-tips.tsx',
    );
    expect(firstLoadFor(`/console/tips/${tipId}/edit`, '', { signedIn: true }).module).toBe(
      'web/app/routes/console-tips.tsx',
    );
    // Not an id: the page's own 404 tells it, and nothing is preloaded for it.
    expect(firstLoadFor('/console/tips/not-an-id/edit', '', { signedIn: true }).module).toBeNull();
    expect(firstLoadFor('/nowhere', '', { signedIn: true })).toEqual({ reads: header, module: null });
  });
});

import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCompany, createPerson, createTank } from '../helpers/factories';
import { HttpBrowser } from '../helpers/http-browser';
import { serveBuild, signIn, startTestStack, type TestStack } from '../helpers/stack';

/** A build as Vite leaves it, reduced to what the shell reads: index.html and the manifest. */
const indexHtml = [
  '<!doctype html>',
  '<html lang="en">',
  '  <head>',
  '    <title>Brinewatch</title>',
  '    <script type="module" crossorigin src="/assets/index-Ab12Cd34.js"></script>',
  '    <link rel="modulepreload" crossorigin href="/assets/runtime-Zz00Yy11.js">',
  '  </head>',
  '  <body><div id="root"></div></body>',
  '</html>',
].join('\n');
const manifest = {
  '_runtime-Zz00Yy11.js': { file: 'assets/runtime-Zz00Yy11.js' },
  'index.html': {
    file: 'assets/index-Ab12Cd34.js',
    isEntry: true,
    imports: ['_runtime-Zz00Yy11.js'],
    dynamicImports: ['web/app/routes/tank.tsx', 'web/app/routes/console.tsx'],
  },
  '_page-Pp11Qq22.js': { file: 'assets/page-Pp11Qq22.js', imports: ['index.html'] },
  '_badges-Bb33Cc44.js': { file: 'assets/badges-Bb33Cc44.js', imports: ['_page-Pp11Qq22.js'] },
  'web/app/routes/tank.tsx': {
    file: 'assets/tank-Tt55Uu66.js',
    isDynamicEntry: true,
    imports: ['_runtime-Zz00Yy11.js', 'index.html', '_badges-Bb33Cc44.js'],
  },
  'web/app/routes/console.tsx': {
    file: 'assets/console-Cc77Dd88.js',
    isDynamicEntry: true,
    imports: ['index.html', '_page-Pp11Qq22.js'],
  },
};

interface ShellLinks {
  fetches: string[];
  modules: string[];
  html: string;
}

describe('GET of a page: the app shell with its first-load preloads', () => {
  let stack: TestStack;
  let served: Awaited<ReturnType<typeof serveBuild>> | undefined;
  let base: string;
  let cookie: string;
  let webDist: string;
  let tankId: string;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const company = await createCompany(db);
    const owner = await createPerson(db, { companyId: company.id, role: 'owner', issuer: stack.idp.issuer });
    tankId = (await createTank(db, { companyId: company.id, owners: [owner] })).id;
    const browser = new HttpBrowser();
    await signIn(stack, browser, owner);
    cookie = browser.cookieHeader(stack.origin);

    webDist = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-web-'));
    mkdirSync(path.join(webDist, '.vite'));
    writeFileSync(path.join(webDist, 'index.html'), indexHtml);
    writeFileSync(path.join(webDist, '.vite', 'manifest.json'), JSON.stringify(manifest));

    // The same app, with the same database and sessions, serving that build.

    served = await serveBuild(stack, webDist);

    base = served.base;
  });

  afterAll(async () => {
    served?.close();
    if (webDist) rmSync(webDist, { recursive: true, force: true });
    await stack?.close();
  });

  async function shell(address: string, withSession = true): Promise<ShellLinks> {
    const res = await fetch(`${base}${address}`, {
      headers: { accept: 'text/html', ...(withSession ? { cookie } : {}) },
    });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/html/);
    const html = await res.text();
    const hrefs = (rel: string) =>
      [...html.matchAll(/<link ([^>]*)>/g)]
        .map(([, attributes]) => attributes!)
        .filter((attributes) => attributes.includes(`rel="${rel}"`) && attributes.includes('data-first-load'))
        .map((attributes) => /href="([^"]*)"/.exec(attributes)![1]!.replaceAll('&amp;', '&'));
    return { fetches: hrefs('preload'), modules: hrefs('modulepreload'), html };
  }

  it("preloads an owner's tank page's reads and its module, as fetch() asks for them", async () => {
    const { fetches, modules, html } = await shell(`/tanks/${tankId}`);

    expect(fetches).toEqual([
      '/api/me',
      '/api/conversations/unread',
      '/api/notifications',
      `/api/tanks/${tankId}`,
      `/api/tanks/${tankId}/urgent-requests`,
      `/api/tanks/${tankId}/conversation`,
      `/api/tanks/${tankId}/visits`,
      `/api/alerts?tankId=${tankId}&status=all`,
      `/api/tanks/${tankId}/readings/latest`,
      `/api/care-tips/feed?limit=3&tankId=${tankId}`,
    ]);
    // Reused by the app's fetch only with fetch's own credentials mode (crossorigin = same-origin).
    expect(html).toContain(`<link rel="preload" as="fetch" crossorigin href="/api/me" data-first-load>`);
    // The route's chunk and what it imports, less what the entry already loads.
    expect(modules.sort()).toEqual(
      ['/assets/badges-Bb33Cc44.js', '/assets/page-Pp11Qq22.js', '/assets/tank-Tt55Uu66.js'].sort(),
    );
    // Inside the head, after the entry's own tags, and no inline script beside the CSP.
    expect(html.indexOf('data-first-load')).toBeGreaterThan(html.indexOf('/assets/runtime-Zz00Yy11.js'));
    expect(html.indexOf('data-first-load')).toBeLessThan(html.indexOf('</head>'));
    expect(html).not.toMatch(/<script(?![^>]*\bsrc=)/);
  });

  it('leaves the summary-only reads out when the address opens another section', async () => {
    const { fetches } = await shell(`/tanks/${tankId}?section=readings`);

    expect(fetches).toContain(`/api/tanks/${tankId}`);
    expect(fetches).not.toContain(`/api/tanks/${tankId}/readings/latest`);
    expect(fetches.some((href) => href.startsWith('/api/alerts'))).toBe(false);
  });

  it("gives the staff console nothing of an owner's: no tank list, no tank", async () => {
    const { fetches, modules } = await shell('/console');

    expect(fetches).toEqual(['/api/me', '/api/conversations/unread', '/api/notifications']);
    expect(fetches.some((href) => href.startsWith('/api/tanks'))).toBe(false);
    expect(modules.sort()).toEqual(['/assets/console-Cc77Dd88.js', '/assets/page-Pp11Qq22.js'].sort());
  });

  it('preloads only who is signed in for a visitor without a session', async () => {
    const { fetches } = await shell(`/tanks/${tankId}`, false);

    expect(fetches).toEqual(['/api/me']);
  });

  it('names no read for an address that is not an id, and says the shell varies with the cookie', async () => {
    const res = await fetch(`${base}/tanks/not-a-tank%22%3E%3Cscript%3E`, {
      headers: { accept: 'text/html', cookie },
    });
    const html = await res.text();

    expect(res.headers.get('vary')).toMatch(/cookie/i);
    expect(html).not.toContain('/api/tanks/');
    expect(html).not.toContain('<script>');
  });
});

import { execFileSync } from 'node:child_process';
import type { Page } from 'playwright-core';
import type * as offlineStoreModule from '../../web/lib/offline-store';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoId } from '../../api/dev/seed/index';
import { axeViolations, openBrowser, screenshot, signInAt, type BrowserSession } from '../helpers/browser';

const technician = 'tomas@driftglass.test';
const staffTank = demoId('quayside-reef');

interface ManifestIcon {
  src: string;
  sizes: string;
  type: string;
  purpose?: string;
}

/**
 * web/lib/offline-store.ts as one script for the page: the build leaves it out until a screen uses
 * it, and evaluating it over the DevTools protocol keeps the page's CSP on, as axe does. Bundled by
 * Vite in a child process, as a build inside the test process keeps it from exiting.
 */
function offlineStoreScript(): string {
  const bundle = `
    import { build } from 'vite';
    const [result] = [await build({
      configFile: false,
      logLevel: 'silent',
      build: {
        write: false,
        emptyOutDir: false,
        copyPublicDir: false,
        minify: false,
        lib: { entry: 'web/lib/offline-store.ts', formats: ['iife'], name: 'offlineStore' },
      },
    })].flat();
    process.stdout.write(result.output[0].code);
  `;
  return execFileSync(process.execPath, ['--input-type=module', '--eval', bundle], { encoding: 'utf8' });
}

declare global {
  interface Window {
    offlineStore: typeof offlineStoreModule;
  }
}

/** The brand link in the header, the footer line and the page's own root: the app, not the browser's error page. */
async function expectShell(page: Page) {
  await page.getByRole('banner').getByRole('link', { name: 'Brinewatch' }).waitFor();
  await page.getByRole('contentinfo').getByText('Brinewatch — tank health between visits.').waitFor();
  expect(await page.locator('#root').count()).toBe(1);
}

const offlineNotice = (page: Page) =>
  page
    .getByRole('status')
    .getByText('You are offline. Brinewatch will load new data when the connection is back.');

describe('Brinewatch installed and offline', () => {
  let session: BrowserSession;
  let page: Page;

  beforeAll(async () => {
    session = await openBrowser();
    page = await signInAt(await session.newPage('phone'), '/console', technician);
  });
  afterAll(async () => {
    await page?.context().setOffline(false);
    await session?.close();
  });

  it('links a manifest whose icons are PNGs of the sizes it names, maskable one included', async () => {
    const manifestHref = await page.locator('link[rel="manifest"]').getAttribute('href');
    expect(manifestHref).toBe('/manifest.webmanifest');
    const response = await fetch(new URL(manifestHref!, session.baseUrl));
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toMatch(/^application\/manifest\+json/);
    const manifest = JSON.parse(await response.text()) as {
      name: string;
      short_name: string;
      start_url: string;
      scope: string;
      display: string;
      theme_color: string;
      background_color: string;
      icons: ManifestIcon[];
    };
    expect(manifest).toMatchObject({
      name: 'Brinewatch',
      short_name: 'Brinewatch',
      start_url: '/',
      scope: '/',
      display: 'standalone',
    });
    // The header colour, as index.html's theme-color; the page background behind the splash.
    expect(manifest.theme_color).toBe(await page.locator('meta[name="theme-color"]').getAttribute('content'));
    expect(manifest.background_color).toBe('#fbf8f2');

    const appleHref = await page.locator('link[rel="apple-touch-icon"]').getAttribute('href');
    const icons: ManifestIcon[] = [
      ...manifest.icons,
      { src: appleHref!, sizes: '180x180', type: 'image/png' },
    ];
    expect(manifest.icons.map((icon) => `${icon.sizes} ${icon.purpose}`).sort()).toEqual([
      '192x192 any',
      '512x512 any',
      '512x512 maskable',
    ]);
    for (const icon of icons) {
      const file = await fetch(new URL(icon.src, session.baseUrl));
      expect(file.status, icon.src).toBe(200);
      expect(file.headers.get('content-type'), icon.src).toBe('image/png');
      const { format, width, height } = await sharp(Buffer.from(await file.arrayBuffer())).metadata();
      expect({ src: icon.src, format, size: `${width}x${height}` }).toEqual({
        src: icon.src,
        format: 'png',
        size: icon.sizes,
      });
    }
  });

  it('serves the worker to be checked on every load and the hashed build files for good', async () => {
    const worker = await fetch(new URL('/sw.js', session.baseUrl));
    expect(worker.status).toBe(200);
    expect(worker.headers.get('cache-control')).toBe('no-cache');

    const entry = await page.locator('script[type="module"][src^="/assets/"]').getAttribute('src');
    const script = await fetch(new URL(entry!, session.baseUrl));
    expect(script.headers.get('cache-control')).toBe('public, max-age=31536000, immutable');
    // A build file that is not there is missing, not the app shell in its place.
    const missing = await fetch(new URL('/assets/no-such-chunk.js', session.baseUrl));
    expect(missing.status).toBe(404);
  });

  it('reopens the app shell with no connection once the worker controls the page', async () => {
    await page.evaluate(async () => {
      await navigator.serviceWorker.ready;
    });
    await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null)).toBe(true);
    // The first visit's own files loaded before the worker existed; it keeps them once told.
    const entry = await page.locator('script[type="module"][src^="/assets/"]').getAttribute('src');
    const styles = await page.locator('link[rel="stylesheet"][href^="/assets/"]').getAttribute('href');
    await expect
      .poll(() =>
        page.evaluate(
          async (urls) => Promise.all(urls.map(async (url) => (await caches.match(url)) !== undefined)),
          ['/', entry!, styles!],
        ),
      )
      .toEqual([true, true, true]);
    // The kept shell opens at any address, so it keeps none of one page's preloads.
    const keptShell = await page.evaluate(async () => (await caches.match('/'))?.text());
    expect(keptShell).toContain('<div id="root"></div>');
    expect(keptShell).not.toContain('data-first-load');
    // A screen opened once while online is kept as it loads.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Calculators' }).click();
    await page.getByRole('heading', { level: 1, name: 'Water calculators' }).waitFor();
    await page.goto('/console');
    await page.getByRole('heading', { level: 1 }).waitFor();
    expect(await offlineNotice(page).count()).toBe(0);

    await page.context().setOffline(true);
    const reloaded = await page.reload();
    expect(reloaded?.fromServiceWorker()).toBe(true);
    await expectShell(page);
    await offlineNotice(page).waitFor();
    expect(new URL(page.url()).pathname).toBe('/console');
    // The data behind the screen cannot come: the screen says why instead of waiting for ever.
    await page
      .getByRole('main')
      .getByRole('alert')
      .getByText('Brinewatch could not be reached. Check your connection.')
      .waitFor();
    await screenshot(page, 'offline-console-phone');

    expect((await page.goto('/calculators'))?.fromServiceWorker()).toBe(true);
    await expectShell(page);
    await page.getByRole('heading', { level: 1, name: 'Water calculators' }).waitFor();
    await page.locator('section#salinity').waitFor();
    await offlineNotice(page).waitFor();
    expect(await axeViolations(page)).toEqual([]);

    // A screen never opened on this device: the shell still stands, saying the connection is gone.
    await page.goto(`/console/tanks/${staffTank}/equipment`);
    await expectShell(page);
    await offlineNotice(page).waitFor();
    await page.getByRole('main').getByRole('heading', { level: 1 }).waitFor();
    expect(await axeViolations(page)).toEqual([]);
  });

  it('keeps work on this device through an offline reload, a photo included', async () => {
    await page.context().setOffline(true);
    const script = offlineStoreScript();
    const photoBytes = [0x52, 0x49, 0x46, 0x46, 1, 2, 3, 255];
    await page.evaluate(script);
    await page.evaluate(async (bytes) => {
      const store = window.offlineStore;
      await store.keepLocally('visit-draft:e2e', {
        notes: 'Skimmer cup emptied; return pump intake cleared.',
        photo: new Blob([new Uint8Array(bytes)], { type: 'image/webp' }),
      });
      await store.keepLocally('visit-draft:e2e-second', { notes: 'Second draft' });
      await store.keepLocally('photo-upload:e2e', { tries: 1 });
    }, photoBytes);

    await page.reload();
    await expectShell(page);
    await page.evaluate(script);
    const kept = await page.evaluate(async () => {
      const store = window.offlineStore;
      const draft = await store.readLocal<{ notes: string; photo: Blob }>('visit-draft:e2e');
      return {
        notes: draft?.notes,
        isBlob: draft?.photo instanceof Blob,
        type: draft?.photo.type,
        bytes: draft ? [...new Uint8Array(await draft.photo.arrayBuffer())] : [],
        drafts: await store.localKeys('visit-draft:'),
        missing: await store.readLocal('visit-draft:never-kept'),
      };
    });
    expect(kept).toEqual({
      notes: 'Skimmer cup emptied; return pump intake cleared.',
      isBlob: true,
      type: 'image/webp',
      bytes: photoBytes,
      drafts: ['visit-draft:e2e', 'visit-draft:e2e-second'],
      missing: undefined,
    });

    const afterForgetting = await page.evaluate(async () => {
      const store = window.offlineStore;
      await store.forgetLocal('visit-draft:e2e');
      await store.forgetLocal('visit-draft:e2e-second');
      return {
        draft: await store.readLocal('visit-draft:e2e'),
        drafts: await store.localKeys('visit-draft:'),
        uploads: await store.localKeys('photo-upload:'),
      };
    });
    expect(afterForgetting).toEqual({ draft: undefined, drafts: [], uploads: ['photo-upload:e2e'] });
  });
});

import type { BrowserContext, ConsoleMessage, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoId } from '../../api/dev/seed/index';
import { axeViolations, openBrowser, signInAt, viewports, type BrowserSession } from '../helpers/browser';

const owner = 'helen@ashdown-home.test';
const livingRoomReef = demoId('ashdown-reef');

interface Timing {
  path: string;
  search: string;
  initiatorType: string;
  startTime: number;
  responseEnd: number;
}

/** What the page loaded, from the browser's own resource timing (one entry per request). */
async function resourceTimings(page: Page): Promise<Timing[]> {
  return page.evaluate(() =>
    performance.getEntriesByType('resource').map((entry) => {
      const url = new URL(entry.name);
      const timing = entry as PerformanceResourceTiming;
      return {
        path: url.pathname,
        search: url.search,
        initiatorType: timing.initiatorType,
        startTime: timing.startTime,
        responseEnd: timing.responseEnd,
      };
    }),
  );
}

/** Console lines worth a developer's attention: errors and warnings (an unused preload is a warning). */
function collectConsole(page: Page): string[] {
  const lines: string[] = [];
  page.on('console', (message: ConsoleMessage) => {
    if (message.type() === 'error' || message.type() === 'warning') lines.push(message.text());
  });
  return lines;
}

describe('the first load of a page', () => {
  let session: BrowserSession;
  let storageState: Awaited<ReturnType<BrowserContext['storageState']>>;

  beforeAll(async () => {
    session = await openBrowser();
    const signedIn = await signInAt(await session.newPage('phone'), '/tanks', owner);
    storageState = await signedIn.context().storageState();
    await signedIn.context().close();
  });
  afterAll(() => session?.close());

  /** A browser that has never loaded the app (no HTTP cache, no service worker) but holds the session. */
  async function coldPage(signedIn: boolean): Promise<Page> {
    const context = await session.browser.newContext({
      viewport: viewports.phone,
      baseURL: session.baseUrl,
      ...(signedIn ? { storageState } : {}),
    });
    return context.newPage();
  }

  it("starts the owner's tank page's API calls from the HTML, each once", async () => {
    const page = await coldPage(true);
    const consoleLines = collectConsole(page);
    await page.goto(`/tanks/${livingRoomReef}`);
    await page.getByRole('heading', { level: 1, name: 'Living room reef' }).waitFor();
    await page.getByRole('heading', { level: 2, name: 'Key readings' }).waitFor();
    await page.waitForLoadState('load');
    // Time for the last queries and for Chromium to report a preload nobody used (a warning).
    await page.waitForTimeout(3_500);

    const timings = await resourceTimings(page);
    const api = timings.filter((t) => t.path.startsWith('/api/') && t.path !== '/api/events');
    const requested = api.map((t) => `${t.path}${t.search}`);
    expect(requested.length).toBeGreaterThan(0);
    expect(requested.filter((url, i) => requested.indexOf(url) !== i)).toEqual([]);

    const entrySrc = await page.locator('script[type="module"][src^="/assets/"]').getAttribute('src');
    const entry = timings.find((t) => t.path === entrySrc);
    const me = api.find((t) => t.path === '/api/me');
    expect(entry).toBeDefined();
    expect(me).toBeDefined();
    expect(me!.startTime).toBeLessThan(entry!.responseEnd);
    expect(consoleLines.filter((line) => /preload/i.test(line))).toEqual([]);
    expect(await axeViolations(page)).toEqual([]);
    await page.context().close();
  });

  it("answers a signed-out visitor's preloaded 401 as signed out, with no more console noise than the fetch had", async () => {
    const page = await coldPage(false);
    const consoleLines = collectConsole(page);
    await page.goto('/');
    await page.getByRole('main').getByRole('link', { name: 'Sign in' }).waitFor();
    await page.waitForLoadState('load');
    await page.waitForTimeout(3_500);

    const requested = (await resourceTimings(page))
      .filter((t) => t.path.startsWith('/api/'))
      .map((t) => `${t.path}${t.search}`);
    expect(requested.filter((url) => url === '/api/me')).toHaveLength(1);
    expect(requested.filter((url, i) => requested.indexOf(url) !== i)).toEqual([]);
    expect(consoleLines.filter((line) => /preload/i.test(line))).toEqual([]);
    // At most the browser's own line for the 401, as for the app's fetch before.
    expect(consoleLines.filter((line) => /failed to load|401/i.test(line)).length).toBeLessThanOrEqual(1);
    expect(await axeViolations(page)).toEqual([]);
    await page.context().close();
  });
});

import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoId } from '../../api/dev/seed/index';
import { demoVisitId } from '../../api/dev/seed/visits';
import {
  axeViolations,
  openBrowser,
  screenshot,
  viewports,
  type BrowserSession,
  signInAt,
} from '../helpers/browser';

/*
 * Every screen of the app (web/app/router.tsx) at a phone's 390 px: nothing may scroll sideways and
 * axe finds nothing. The dashboard and the tank page are also photographed at both sizes.
 */

const ownersTank = demoId('ashdown-reef');
const staffTank = demoId('quayside-reef');
const tankSections = [
  'summary',
  'readings',
  'visits',
  'timeline',
  'livestock',
  'equipment',
  'about',
] as const;

/** Uncaught errors in the page, by page: a screen that threw is not a screen that fits. */
const pageErrors = new WeakMap<Page, string[]>();
async function newPage(session: BrowserSession): Promise<Page> {
  const page = await session.newPage('phone');
  const errors: string[] = [];
  pageErrors.set(page, errors);
  page.on('pageerror', (error) => errors.push(error.message));
  page.on('console', (message) => {
    // A refused request (the 401 before signing in) is the app working; a thrown render is not.
    if (message.type() === 'error' && !message.text().startsWith('Failed to load resource')) {
      errors.push(message.text());
    }
  });
  return page;
}

async function signIn(session: BrowserSession, email: string, path: string): Promise<Page> {
  return signInAt(await newPage(session), path, email);
}

/** The page's heading is up and nothing is still loading. */
async function settled(page: Page) {
  await page.locator('main h1').first().waitFor();
  await expect
    .poll(
      () =>
        page
          .locator('main [role="status"]')
          .filter({ hasText: /^Loading/ })
          .count(),
      {
        timeout: 30_000,
      },
    )
    .toBe(0);
}

/** What sticks out past the right edge, named so a failure says where to look. */
function overflowReport(page: Page) {
  return page.evaluate(() => {
    const width = window.innerWidth;
    const sticking: string[] = [];
    for (const element of document.body.querySelectorAll<HTMLElement>('*')) {
      const rect = element.getBoundingClientRect();
      if (rect.width === 0 || rect.right <= width + 0.5) continue;
      // Inside a box that scrolls sideways on its own, sticking out is how it scrolls.
      let scroller = element.parentElement;
      let clipped = false;
      while (scroller && scroller !== document.body) {
        const overflowX = getComputedStyle(scroller).overflowX;
        if (overflowX !== 'visible') {
          clipped = true;
          break;
        }
        scroller = scroller.parentElement;
      }
      if (clipped) continue;
      const name = `${element.tagName.toLowerCase()}${element.id ? `#${element.id}` : ''}.${[
        ...element.classList,
      ]
        .slice(0, 4)
        .join('.')} "${(element.textContent ?? '').trim().slice(0, 40)}" right=${Math.round(rect.right)}`;
      sticking.push(name);
    }
    return {
      scrollWidth: document.documentElement.scrollWidth,
      innerWidth: width,
      sticking: sticking.slice(0, 8),
    };
  });
}

/** One screen at 390 px: no sideways scrolling, nothing for axe. */
async function checkPhone(page: Page, path: string, ready: () => Promise<unknown> = () => settled(page)) {
  await page.setViewportSize(viewports.phone);
  if (path !== '') await page.goto(path);
  await ready();
  const report = await overflowReport(page);
  expect
    .soft(report.scrollWidth, `${path || page.url()} scrolls sideways: ${report.sticking.join(' | ')}`)
    .toBeLessThanOrEqual(report.innerWidth);
  expect.soft(await axeViolations(page), `axe on ${path || page.url()}`).toEqual([]);
  expect.soft(pageErrors.get(page)?.splice(0) ?? [], `errors on ${path || page.url()}`).toEqual([]);
}

async function photograph(page: Page, name: string) {
  for (const viewport of ['phone', 'desktop'] as const) {
    await page.setViewportSize(viewports[viewport]);
    await page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(page, `${name}-${viewport}`);
  }
  await page.setViewportSize(viewports.phone);
}

describe('every screen at 390 px', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(() => session.close());

  it('fits the public screens', async () => {
    const page = await newPage(session);
    for (const path of [
      '/',
      '/calculators',
      '/no-access',
      '/sign-in-problem',
      '/invitation-invalid',
      '/no-such-page',
    ]) {
      await checkPhone(page, path);
    }
    await page.context().close();
  });

  it("fits the owner's screens, with tanks in trouble first and the tank page in sections", async () => {
    const page = await signIn(session, 'helen@ashdown-home.test', '/tanks');
    await checkPhone(page, '/tanks', async () => {
      await settled(page);
      await page.getByRole('heading', { level: 2, name: 'Living room reef' }).waitFor();
    });
    await photograph(page, 'phone-layout-dashboard');

    for (const section of tankSections) {
      const path = section === 'summary' ? `/tanks/${ownersTank}` : `/tanks/${ownersTank}?section=${section}`;
      await checkPhone(page, path);
      await screenshot(page, `phone-layout-tank-${section}-phone`);
      const current = page
        .getByRole('navigation', { name: 'Tank sections' })
        .locator('[aria-current="page"]');
      expect.soft(await current.count(), `one current section on ${path}`).toBe(1);
      if (section === 'summary') {
        await page.getByRole('region', { name: 'Alerts' }).waitFor();
        await page.getByRole('heading', { name: 'Key readings' }).waitFor();
        await page.getByText('What to do next:').waitFor();
        // The summary answers "is my tank OK?" before the first phone screen ends.
        const status = await page.getByText('What to do next:').boundingBox();
        expect(status?.y ?? Infinity).toBeLessThan(viewports.phone.height);
        await photograph(page, 'phone-layout-tank-page');
      }
    }
    // The section lives in the address, so the back button steps back through the sections.
    await page.goto(`/tanks/${ownersTank}`);
    await settled(page);
    await page
      .getByRole('navigation', { name: 'Tank sections' })
      .getByRole('link', { name: 'Livestock' })
      .click();
    await page.getByRole('region', { name: 'Livestock' }).waitFor();
    await page.goBack();
    await page.getByRole('heading', { name: 'Key readings' }).waitFor();
    expect(new URL(page.url()).searchParams.get('section')).toBeNull();

    await checkPhone(page, '/settings/notifications');
    await page.context().close();
  });

  it("fits staff's screens, the readings table as cards and the CSV help included", async () => {
    const page = await signIn(session, 'mara@driftglass.test', '/console');
    for (const path of [
      '/console',
      '/console/tanks/new',
      `/console/tanks/${staffTank}/edit`,
      `/console/tanks/${staffTank}/livestock`,
      `/console/tanks/${staffTank}/equipment`,
      '/console/clients',
      '/console/alerts',
      '/console/audit',
      '/console/staff',
      '/console/schedule',
      '/console/tips',
      '/console/tips/new',
      `/visits/${demoVisitId('quayside-reef', 'chiller')}`,
      '/settings/notifications',
    ]) {
      await checkPhone(page, path);
    }
    for (const section of tankSections) {
      await checkPhone(page, `/tanks/${staffTank}?section=${section}`);
      if (section === 'readings') {
        // Staff tools live in the readings section, not on the summary.
        await page.getByRole('heading', { name: 'Limits' }).waitFor();
        await page.getByText('Recorded as').waitFor();
      }
    }
    await page.goto(`/tanks/${staffTank}`);
    await settled(page);
    expect(await page.getByRole('heading', { name: 'Limits' }).count()).toBe(0);

    await page.goto(`/tanks/${staffTank}?section=readings`);
    await settled(page);
    await page.getByRole('group', { name: 'Show as' }).getByText('Table').click();
    const cards = page.getByRole('list', { name: 'Readings, newest first' });
    await cards.getByRole('listitem').first().waitFor();
    await page.getByText('What the file looks like').click();
    await checkPhone(page, '', () => cards.waitFor());
    await page.context().close();
  });

  it('opens the technician on their own tanks, with everyone one tap away', async () => {
    const page = await signIn(session, 'tomas@driftglass.test', '/console');
    const whose = page.getByRole('navigation', { name: 'Whose tanks' });
    await checkPhone(page, '', () => whose.getByRole('link', { name: 'My tanks' }).waitFor());
    expect(await whose.getByRole('link', { name: 'My tanks' }).getAttribute('aria-current')).toBe('page');
    await whose.getByRole('link', { name: 'Everyone' }).click();
    // Other browser tests share this database and may add a tank meanwhile; tanks.test.ts checks the count.
    await page.getByText(/^\d+ tanks for \d+ clients$/).waitFor();
    expect(await whose.getByRole('link', { name: 'Everyone' }).getAttribute('aria-current')).toBe('page');
    await page.context().close();
  });
});

import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TankSummary } from '@shared/schemas/tanks';
import type { UrgentRequestView } from '@shared/schemas/urgent-requests';
import { openUrgentStatuses, urgentStatusNames, type UrgentStatus } from '@shared/urgent/lifecycle';
import { demoId } from '../../api/dev/seed/index';
import { demoVisitId } from '../../api/dev/seed/visits';
import {
  apiInPage,
  axeViolations,
  openBrowser,
  screenshot,
  viewports,
  type BrowserSession,
  signInAt,
} from '../helpers/browser';

/*
 * Every screen of the app (web/app/router.tsx) at a phone's 390 px: nothing may scroll sideways and
 * axe finds nothing. The dashboard and the tank page are also photographed at both sizes, and so is
 * each screen of conversations and urgent visit requests, whose every control must also be big
 * enough for a thumb.
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

/**
 * Controls on the phone smaller than 44 × 44 px: 44 px is common practice for a thumb (WCAG 2.2's
 * 2.5.5 asks the same at AAA). Links inside running text are exempt, as WCAG 2.2's 2.5.8 exempts
 * inline targets; a radio, checkbox or file input is measured by the label that carries it.
 */
function smallTargets(page: Page) {
  return page.evaluate(() => {
    const small: string[] = [];
    const targets = document.querySelectorAll<HTMLElement>(
      [
        // The header's own links and buttons are the layout's; its Messages button is new here.
        'header a[aria-label^="Messages"]',
        'header nav a',
        'main a',
        'main button',
        'main summary',
        'main select',
        'main textarea',
        'main input:not([type="radio"]):not([type="checkbox"]):not([type="hidden"])',
        'main label:has(input[type="radio"])',
        'main label:has(input[type="checkbox"])',
        'main label:has(input[type="file"])',
      ].join(', '),
    );
    for (const element of targets) {
      const style = getComputedStyle(element);
      if (style.display === 'inline' || style.visibility === 'hidden') continue;
      const box = element.getBoundingClientRect();
      // Drawn away (a screen-reader-only input whose label is the target) or not shown at all.
      if (box.width <= 1 || box.height <= 1) continue;
      if (box.width >= 43.5 && box.height >= 43.5) continue;
      const name = (element.getAttribute('aria-label') ?? element.textContent ?? '').trim().slice(0, 40);
      small.push(
        `${element.tagName.toLowerCase()} "${name}" ${Math.round(box.width)}×${Math.round(box.height)}`,
      );
    }
    return small;
  });
}

/** A screen of conversations or urgent requests at 390 px: fits, axe-clean, and every control thumb-sized. */
async function checkNewScreen(page: Page, path: string, ready: () => Promise<unknown>) {
  await checkPhone(page, path, ready);
  expect.soft(await smallTargets(page), `small tap targets on ${path || page.url()}`).toEqual([]);
}

/** One of the signed-in person's tanks, found by its name through the API as they see it. */
async function tankIdByName(page: Page, name: string): Promise<string> {
  const tanks = await apiInPage<TankSummary[]>(page, 'GET', '/tanks');
  const tank = tanks.find((candidate) => candidate.name === name);
  if (!tank) throw new Error(`no tank named ${name} among ${tanks.map((t) => t.name).join(', ')}`);
  return tank.id;
}

const isOpenStatus = (status: UrgentStatus) =>
  (openUrgentStatuses as readonly UrgentStatus[]).includes(status);

/**
 * `from: 'end'` for a screen with a conversation: its composer sticks to the bottom of the screen,
 * and pictured from the top it would sit over the thread instead of under it.
 */
async function photograph(page: Page, name: string, { from = 'top' }: { from?: 'top' | 'end' } = {}) {
  for (const viewport of ['phone', 'desktop'] as const) {
    await page.setViewportSize(viewports[viewport]);
    await page.evaluate(
      (end) => window.scrollTo(0, end ? document.documentElement.scrollHeight : 0),
      from === 'end',
    );
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

  it("fits the owner's conversation, the urgent form with its first aid, and an open request", async () => {
    // The demo's restaurant owner, whose lagoon has a request open today, acknowledged.
    const page = await signIn(session, 'rosa@saltfig-kitchen.test', '/tanks');
    const lagoon = await tankIdByName(page, 'Dining room lagoon');
    const requests = await apiInPage<UrgentRequestView[]>(page, 'GET', `/tanks/${lagoon}/urgent-requests`);
    const open = requests.find((request) => isOpenStatus(request.status));
    if (!open) throw new Error('the demo has no open urgent request on the lagoon');
    // A line about that request, so the thread shows one and staff's inbox has it waiting.
    const question =
      'The foam stopped once the skimmer was off. Is it all right to leave it off until Tomas gets here?';
    await apiInPage(page, 'POST', `/tanks/${lagoon}/conversation/messages`, {
      body: question,
      urgentRequestId: open.id,
    });

    const composer = page.getByRole('form', { name: 'Write a message' });
    await checkNewScreen(page, `/tanks/${lagoon}/messages`, async () => {
      await settled(page);
      await page.getByRole('log').getByText(question).waitFor();
      await composer.waitFor();
    });
    await photograph(page, 'phone-layout-messages-owner', { from: 'end' });

    // The form with a category chosen, so the first aid and its cautions show (nothing is sent).
    const form = page.getByRole('form', { name: 'Request an urgent visit' });
    await checkNewScreen(page, `/tanks/${lagoon}/urgent`, async () => {
      await settled(page);
      await form.getByRole('radio', { name: /^Water leak or flood/ }).check();
      await form.getByRole('region', { name: /^First aid while you wait/ }).waitFor();
    });
    // The choice brings the first aid's heading onto the phone's screen, the chosen tile still in view.
    const firstAidHeading = form.getByRole('heading', { name: /^First aid while you wait/ });
    await expect
      .poll(async () => {
        const box = await firstAidHeading.boundingBox();
        return box === null ? Infinity : box.y + box.height;
      })
      .toBeLessThanOrEqual(viewports.phone.height);
    const tile = await form.locator('label').filter({ hasText: 'Water leak or flood' }).boundingBox();
    expect(tile?.y ?? -1).toBeGreaterThanOrEqual(0);
    // The cautions come before the steps, where a hurried reader looks first.
    const firstAid = form.getByRole('region', { name: /^First aid while you wait/ });
    const cautionsAt = (await firstAid.getByRole('note', { name: 'Safety first' }).boundingBox())?.y;
    const stepsAt = (await firstAid.getByRole('heading', { name: 'What to do now' }).boundingBox())?.y;
    expect(cautionsAt ?? Infinity).toBeLessThan(stepsAt ?? -Infinity);
    await photograph(page, 'phone-layout-urgent-form');

    const progress = page.getByRole('list', { name: 'Progress of the request' });
    await checkNewScreen(page, `/urgent/${open.id}`, async () => {
      await settled(page);
      await progress.waitFor();
      await page.getByRole('log').getByText(question).waitFor();
      await composer.waitFor();
    });
    expect(await progress.locator('[aria-current="step"]').textContent()).toContain(
      urgentStatusNames[open.status],
    );
    // The first aid again, unfolded, as an owner waiting for the technician reads it.
    await page.getByText('First aid and safety while you wait').click();
    await checkNewScreen(page, '', () => page.getByRole('note', { name: 'Safety first' }).waitFor());
    await photograph(page, 'phone-layout-urgent-request-owner', { from: 'end' });
    await page.context().close();
  });

  it("fits staff's inbox, urgent board and a request with its next steps", async () => {
    const page = await signIn(session, 'tomas@driftglass.test', '/console/inbox');
    await checkNewScreen(page, '/console/inbox', () => settled(page));
    await photograph(page, 'phone-layout-inbox');
    await checkNewScreen(page, '/console/inbox?filter=unanswered', () => settled(page));

    const board = page.getByRole('article');
    await checkNewScreen(page, '/console/urgent', async () => {
      await settled(page);
      await board.first().waitFor();
    });
    await photograph(page, 'phone-layout-urgent-board');
    await checkNewScreen(page, '/console/urgent?state=closed', async () => {
      await settled(page);
      await board.first().waitFor();
    });

    const openRequests = await apiInPage<UrgentRequestView[]>(page, 'GET', '/urgent-requests?state=open');
    const acknowledged = openRequests.find((request) => request.status === 'acknowledged');
    if (!acknowledged) throw new Error('the demo has no acknowledged urgent request');
    const next = page.getByRole('region', { name: 'Next step' });
    await checkNewScreen(page, `/urgent/${acknowledged.id}`, async () => {
      await settled(page);
      await next.getByRole('button', { name: /^(Assign|Reassign) technician$/ }).waitFor();
      await page.getByRole('form', { name: /^Write a/ }).waitFor();
    });
    await photograph(page, 'phone-layout-urgent-request-staff', { from: 'end' });

    const closedRequests = await apiInPage<UrgentRequestView[]>(page, 'GET', '/urgent-requests?state=closed');
    const resolved = closedRequests.find((request) => request.status === 'resolved');
    if (!resolved) throw new Error('the demo has no resolved urgent request');
    await checkNewScreen(page, `/urgent/${resolved.id}`, async () => {
      await settled(page);
      await page.getByRole('list', { name: 'Progress of the request' }).waitFor();
    });
    await photograph(page, 'phone-layout-urgent-request-resolved', { from: 'end' });

    // The thread as staff write it: the internal-note switch under the box.
    await checkNewScreen(page, `/tanks/${acknowledged.tankId}/messages`, async () => {
      await settled(page);
      await page.getByRole('checkbox', { name: 'Internal note (staff only)' }).waitFor();
    });
    await photograph(page, 'phone-layout-messages-staff', { from: 'end' });
    await page.context().close();
  });

  it("fits the admin's urgent settings, with urgent requests and messages in view in the header", async () => {
    const page = await signIn(session, 'mara@driftglass.test', '/console/urgent/settings');
    const form = page.getByRole('form', { name: 'Urgent visit settings' });
    await checkNewScreen(page, '/console/urgent/settings', async () => {
      await settled(page);
      await form.waitFor();
    });
    await photograph(page, 'phone-layout-urgent-settings');

    // At 1280 px the header shows the way to urgent requests and to messages without scrolling its row.
    await page.setViewportSize(viewports.desktop);
    const nav = page.getByRole('navigation', { name: 'Main' });
    const row = await nav.boundingBox();
    const urgent = await nav.getByRole('link', { name: /^Urgent/ }).boundingBox();
    expect(urgent!.x + urgent!.width).toBeLessThanOrEqual(row!.x + row!.width);
    expect(
      await page
        .getByRole('banner')
        .getByRole('link', { name: /^Messages/ })
        .isVisible(),
    ).toBe(true);
    await screenshot(page, 'phone-layout-admin-header-desktop');
    await page.context().close();
  });

  it('fits the empty, loading and failed states of the inbox, the urgent board, a thread and a request', async () => {
    const page = await signIn(session, 'tomas@driftglass.test', '/console');
    const lagoon = await tankIdByName(page, 'Dining room lagoon');
    const unavailable = { status: 503, json: { error: { code: 'unavailable', message: 'Try again soon.' } } };

    const inbox = (url: URL) => url.pathname === '/api/conversations';
    await page.route(inbox, (route) => route.fulfill({ json: [] }));
    await checkNewScreen(page, '/console/inbox', () => page.getByText('No conversations yet').waitFor());
    await photograph(page, 'phone-layout-inbox-empty');
    await page.unroute(inbox);

    const board = (url: URL) => url.pathname === '/api/urgent-requests';
    await page.route(board, (route) => route.fulfill(unavailable));
    const failed = page.getByRole('alert').filter({ hasText: 'We could not load the urgent requests' });
    await checkNewScreen(page, '/console/urgent', () =>
      failed.getByRole('button', { name: 'Try again' }).waitFor(),
    );
    await photograph(page, 'phone-layout-urgent-board-failed');
    await page.unroute(board);

    // The thread's messages never come: the composer is there to write in meanwhile.
    const thread = (url: URL) => url.pathname === `/api/tanks/${lagoon}/conversation/messages`;
    await page.route(thread, () => undefined);
    await checkNewScreen(page, `/tanks/${lagoon}/messages`, async () => {
      await page.getByRole('status').filter({ hasText: 'Loading messages…' }).waitFor();
      await page.getByRole('form', { name: /^Write a/ }).waitFor();
    });
    await photograph(page, 'phone-layout-messages-loading');
    await page.unroute(thread);

    const missing = page.getByRole('alert').filter({ hasText: 'We could not find this urgent request' });
    await checkNewScreen(page, `/urgent/${crypto.randomUUID()}`, () => missing.waitFor());
    await page.context().close();
  });
});

import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TimelinePage } from '@shared/schemas/timeline';
import { demoId } from '../../api/dev/seed/index';
import {
  apiInPage,
  artifactsDir,
  type BrowserSession,
  expectAxeClean,
  openBrowser,
  screenshot,
  signInAt,
  viewports,
} from '../helpers/browser';

/*
 * The owner of the living room reef reads its timeline on a 390 px phone: visit reports and
 * livestock changes from the demo story, and an alert that opened and was resolved while this test
 * ran; filters to alerts only; loads older entries. The e2e database is shared by every browser
 * test: the alert raised here is resolved here and the temperature put back in range.
 */

const tankId = demoId('ashdown-reef');

/** A temperature taken at a visit, recorded by the signed-in technician through the app's API. */
const recordTemperature = (page: Page, celsius: number) =>
  apiInPage(page, 'POST', `/tanks/${tankId}/readings`, {
    source: 'visit',
    readings: [
      { parameter: 'temperature', value: celsius, unit: '°C', measuredAt: new Date().toISOString() },
    ],
  });

/** Resolves whatever is open on the tank (the jump back into range is itself a fast change); how many were. */
async function resolveTheRest(page: Page): Promise<number> {
  const open = await apiInPage<{ id: string }[]>(page, 'GET', `/alerts?tankId=${tankId}&status=active`);
  for (const alert of open) {
    await page.evaluate(async (id) => {
      await fetch(`/api/alerts/${id}/resolve`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'x-requested-with': 'brinewatch' },
        body: JSON.stringify({ note: 'Checked at the tank: back in range.' }),
      });
    }, alert.id);
  }
  return open.length;
}

/** The kind words of every entry shown, top to bottom. */
const kindsShown = (page: Page) =>
  page
    .getByRole('list', { name: 'Timeline, newest first' })
    .getByRole('article')
    .evaluateAll((articles) => articles.map((article) => article.querySelector('p span')?.textContent ?? ''));

describe('a tank’s timeline on a phone', () => {
  let session: BrowserSession;
  let technician: Page;
  let owner: Page;

  beforeAll(async () => {
    session = await openBrowser();
    technician = await signInAt(await session.newPage('desktop'), '/console', 'tomas@driftglass.test');
  });
  afterAll(async () => {
    // Even when a step above failed, leave the tank in range with nothing open.
    if (technician) {
      await recordTemperature(technician, 25.6);
      await resolveTheRest(technician);
    }
    await session?.close();
  });

  it('shows the owner entries of several kinds, grouped by day on the tank’s clock', async () => {
    // An alert opens at a visit and is resolved once the water is back in range.
    await recordTemperature(technician, 30.5);
    await expect
      .poll(
        async () =>
          (await apiInPage<TimelinePage>(technician, 'GET', `/tanks/${tankId}/timeline?kinds=alert`)).entries
            .length,
        { timeout: 60_000 },
      )
      .toBeGreaterThan(0);
    await recordTemperature(technician, 25.6);
    await expect.poll(() => resolveTheRest(technician), { timeout: 60_000 }).toBe(0);

    owner = await signInAt(await session.newPage('phone'), `/tanks/${tankId}`, 'helen@ashdown-home.test');
    await owner
      .getByRole('navigation', { name: 'Tank sections' })
      .getByRole('link', { name: 'Timeline' })
      .click();
    await owner.waitForURL((url) => url.searchParams.get('section') === 'timeline');
    const region = owner.getByRole('region', { name: 'Timeline' });
    const list = region.getByRole('list', { name: 'Timeline, newest first' });
    await list.waitFor();

    await region.getByRole('heading', { level: 3, name: 'Today' }).waitFor();
    await list.getByRole('link', { name: 'Alert opened: Temperature too high', exact: true }).waitFor();
    await list.getByRole('link', { name: 'Alert resolved: Temperature too high', exact: true }).waitFor();
    const kinds = new Set(await kindsShown(owner));
    expect([...kinds].sort()).toEqual(expect.arrayContaining(['Alert', 'Livestock change', 'Visit report']));
    // Each entry names its time on the tank's clock, and links to where it is told in full.
    const firstVisit = list.getByRole('article').filter({ hasText: 'Visit report' }).first();
    expect(await firstVisit.locator('time').first().textContent()).toMatch(/^\d\d:\d\d$/);
    expect(await firstVisit.getByRole('link').first().getAttribute('href')).toMatch(
      new RegExp(`^/tanks/${tankId}\\?section=visits&visit=[0-9a-f-]{36}$`),
    );
    expect(await owner.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      viewports.phone.width,
    );
    await expectAxeClean(owner, 'the timeline at 390 px');
    await screenshot(owner, 'timeline-phone');
  });

  it('filters to one kind', async () => {
    const region = owner.getByRole('region', { name: 'Timeline' });
    await region.getByRole('group', { name: 'Show' }).getByRole('radio', { name: 'Alerts' }).click();
    await expect.poll(async () => new Set(await kindsShown(owner))).toEqual(new Set(['Alert']));
    expect((await kindsShown(owner)).length).toBeGreaterThanOrEqual(2);
    expect(await region.getByRole('button', { name: 'Show older' }).count()).toBe(0);
    await expectAxeClean(owner, 'the timeline filtered to alerts');

    await region.getByRole('group', { name: 'Show' }).getByRole('radio', { name: 'Everything' }).click();
    await expect.poll(async () => new Set(await kindsShown(owner)).size).toBeGreaterThan(1);
  });

  it('loads older entries, each once', async () => {
    const all = await apiInPage<TimelinePage>(owner, 'GET', `/tanks/${tankId}/timeline?limit=100`);
    // The demo story of this tank is longer than one page, or there is nothing older to load.
    expect(all.entries.length).toBeGreaterThan(20);

    const region = owner.getByRole('region', { name: 'Timeline' });
    const articles = region.getByRole('list', { name: 'Timeline, newest first' }).getByRole('article');
    const firstPage = await articles.count();
    expect(firstPage).toBe(20);
    await region.getByRole('button', { name: 'Show older' }).click();
    await expect.poll(() => articles.count()).toBe(Math.min(40, all.entries.length));
    const ids = await articles.evaluateAll((nodes) => nodes.map((node) => node.id));
    expect(new Set(ids).size).toBe(ids.length);
    expect(ids).toEqual(all.entries.slice(0, ids.length).map((e) => `timeline-${e.kind}-${e.id}`));
    await expectAxeClean(owner, 'the timeline after loading older entries');

    await owner.setViewportSize(viewports.desktop);
    await expectAxeClean(owner, 'the timeline at 1280 px');
    await screenshot(owner, 'timeline-desktop');
  });
  it('opens a care tip linked from a notification: found, scrolled to, marked and readable in full', async () => {
    // The demo sends care tips to this tank; the oldest may lie beyond the first page.
    const tips = await apiInPage<TimelinePage>(owner, 'GET', `/tanks/${tankId}/timeline?kinds=tip&limit=100`);
    expect(tips.entries.length).toBeGreaterThan(0);
    const tip = tips.entries.at(-1)!;
    await owner.setViewportSize(viewports.phone);
    await owner.goto(tip.link);

    const article = owner.locator(`#timeline-tip-${tip.id}`);
    await expect.poll(() => article.getAttribute('aria-current'), { timeout: 30_000 }).toBe('true');
    await article.getByText('The tip you opened').waitFor();
    expect(await article.locator('details').evaluate((details) => (details as HTMLDetailsElement).open)).toBe(
      true,
    );
    await expect
      .poll(async () => {
        const box = await article.boundingBox();
        return box !== null && box.y >= 0 && box.y < viewports.phone.height;
      })
      .toBe(true);
    await expectAxeClean(owner, 'a linked care tip on the timeline');
    await owner.screenshot({ path: `${artifactsDir}/timeline-linked-tip-phone.png` });
  });
});

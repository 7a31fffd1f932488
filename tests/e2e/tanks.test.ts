import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoId } from '../../api/dev/seed/index';
import { demoPassword } from '../../api/dev/demo-people';
import { axeViolations, openBrowser, screenshot, viewports, type BrowserSession } from '../helpers/browser';

const livingRoomReef = demoId('ashdown-reef');

/** Signs in through the identity provider from a guarded page and comes back to it. */
async function signIn(session: BrowserSession, email: string, path: string): Promise<Page> {
  const page = await session.newPage('phone');
  await page.goto(path);
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill(demoPassword);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => url.pathname === path);
  return page;
}

/** Every photo on the page, once scrolled into view and decoded; photos come through the API. */
async function photosOn(page: Page): Promise<{ path: string; width: number }[]> {
  await page.evaluate(() => window.scrollTo(0, document.body.scrollHeight));
  return page.evaluate(async () => {
    const images = [...document.querySelectorAll<HTMLImageElement>('main img')];
    // Lazy images load when they near the viewport; ask for all of them at once instead.
    for (const image of images) image.loading = 'eager';
    await Promise.all(images.map((image) => image.decode().catch(() => undefined)));
    return images.map((image) => ({ path: new URL(image.currentSrc).pathname, width: image.naturalWidth }));
  });
}

/** Checks one screen at both sizes: no axe findings, nothing wider than the phone, a screenshot of each. */
async function checkScreen(page: Page, name: string, ready: () => Promise<unknown>) {
  for (const viewport of ['phone', 'desktop'] as const) {
    await page.setViewportSize(viewports[viewport]);
    await ready();
    expect(await axeViolations(page), `${name} at ${viewport}`).toEqual([]);
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow, `${name} at ${viewport} scrolls sideways`).toBeLessThanOrEqual(0);
    await photosOn(page);
    await screenshot(page, `${name}-${viewport}`);
  }
}

describe('tanks, livestock and equipment in the browser', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(() => session.close());

  describe('as the owner', () => {
    let page: Page;
    beforeAll(async () => {
      page = await signIn(session, 'helen@ashdown-home.test', '/tanks');
    });

    it('shows each tank as a card with its cover photo and status', async () => {
      await checkScreen(page, 'owner-my-tanks', async () => {
        await page.getByRole('heading', { level: 2, name: 'Living room reef' }).waitFor();
        await page.getByRole('heading', { level: 2, name: "Kids' river tank" }).waitFor();
      });
      const photos = await photosOn(page);
      expect(photos).toHaveLength(2);
      expect(photos.filter((photo) => photo.width === 0 || !photo.path.startsWith('/api/photos/'))).toEqual(
        [],
      );
      expect(await page.getByText('Quayside').count()).toBe(0);
    });

    it('opens the tank page with livestock, their photos and condition, and the power-board map', async () => {
      await page.getByRole('link', { name: 'Living room reef' }).click();
      await page.waitForURL(`**/tanks/${livingRoomReef}`);
      const livestock = page.getByRole('region', { name: 'Livestock' });
      const sections = page.getByRole('navigation', { name: 'Tank sections' });

      await checkScreen(page, 'owner-tank-page', () =>
        page.getByRole('heading', { name: 'Key readings' }).waitFor(),
      );
      const summaryPhotos = await photosOn(page);
      // Livestock and the power boards are a tap away, each in its own section.
      await page.setViewportSize(viewports.phone);
      await sections.getByRole('link', { name: 'Livestock' }).click();
      await checkScreen(page, 'owner-tank-livestock', () =>
        livestock.getByRole('heading', { name: 'Pip and Dot' }).waitFor(),
      );

      // The anemone was taken out at a visit after it stung the hammer coral, which is still watched.
      const hammer = livestock
        .getByRole('listitem')
        .filter({ has: page.getByRole('heading', { name: 'Hammer coral' }) });
      expect(await hammer.getByText('Keep an eye on', { exact: true }).count()).toBe(1);
      expect(
        await hammer
          .getByText(/retracted after contact/)
          .first()
          .isVisible(),
      ).toBe(true);
      const gone = livestock.locator('details').filter({ hasText: 'No longer in the tank' });
      expect(await gone.getByText(/Bubble-tip anemone/).count()).toBe(1);
      expect(await livestock.getByText('Toxic to touch: gloves and eye protection').count()).toBeGreaterThan(
        0,
      );
      const livestockPhotos = await photosOn(page);

      await page.setViewportSize(viewports.phone);
      await sections.getByRole('link', { name: 'Equipment' }).click();
      await checkScreen(page, 'owner-tank-equipment', () =>
        page.getByRole('heading', { name: 'Board B' }).waitFor(),
      );
      expect(await page.getByText('Water and electricity: switch off first').count()).toBe(1);
      expect(
        await page.getByRole('list', { name: 'Outlets on board B' }).getByText('Dosing pump').count(),
      ).toBeGreaterThan(0);
      const photos = [...summaryPhotos, ...livestockPhotos, ...(await photosOn(page))];
      expect(photos.length).toBeGreaterThanOrEqual(6);
      expect(photos.filter((photo) => photo.width === 0 || !photo.path.startsWith('/api/photos/'))).toEqual(
        [],
      );
    });

    it("is told another client's tank is not there", async () => {
      await page.goto(`/tanks/${demoId('quayside-reef')}`);
      await page.getByText('We could not find this tank.', { exact: false }).waitFor();
    });
  });

  describe('as a technician', () => {
    let page: Page;
    beforeAll(async () => {
      page = await signIn(session, 'tomas@driftglass.test', '/console');
    });

    it('lists clients and tanks, searches and filters by technician', async () => {
      // A technician opens on their own tanks; everyone's are one tap away.
      const whose = page.getByRole('navigation', { name: 'Whose tanks' });
      expect(await whose.getByRole('link', { name: 'My tanks' }).getAttribute('aria-current')).toBe('page');
      await whose.getByRole('link', { name: 'Everyone' }).click();
      await checkScreen(page, 'console-tanks', () => page.getByText('5 tanks for 4 clients').waitFor());

      await page.getByRole('searchbox', { name: /Search/ }).fill('dental');
      await page.getByText('1 tank for 1 client').waitFor();
      await page.getByRole('searchbox', { name: /Search/ }).fill('');
      await page.getByLabel(/Technician/).selectOption({ label: 'Priya Raman' });
      await page.getByText('3 tanks for 3 clients').waitFor();
      expect(new URL(page.url()).searchParams.get('technicianId')).not.toBeNull();
    });

    it('filters by status with each count in its label, keeps it in the address, and clears an empty result', async () => {
      await page.goto('/console?technicianId=everyone');
      const summary = page.getByText(/^\d+ tanks? for \d+ clients?$/);
      const all = Number((await summary.innerText()).split(' ')[0]);
      const statuses = page.getByRole('group', { name: 'Status' });
      const labels = await statuses.locator('label').allInnerTexts();
      const counts = Object.fromEntries(
        labels.map((label): [string, number] => {
          const [, word = label, count] = /^(.+) \((\d+)\)$/.exec(label.trim()) ?? [];
          return [word, Number(count)];
        }),
      );
      expect(Object.keys(counts)).toEqual(['Alert', 'Watch', 'No recent data', 'Healthy']);
      expect(Object.values(counts).reduce((sum, count) => sum + count, 0)).toBe(all);
      // The demo keeps some tanks on watch; the list is short enough to come in one page.
      const onWatch = counts.Watch!;
      expect(onWatch).toBeGreaterThan(0);
      expect(await page.getByRole('button', { name: 'Show more tanks' }).count()).toBe(0);

      await statuses.getByRole('checkbox', { name: /^Watch/ }).check();
      const badges = (word: string) =>
        page.getByRole('main').getByText(word, { exact: true }).filter({ visible: true }).count();
      await page.getByText(new RegExp(`^${onWatch} tanks? for \\d+ clients?$`)).waitFor();
      expect(new URL(page.url()).searchParams.get('status')).toBe('watch');
      expect(await badges('Watch')).toBe(onWatch);
      expect(await badges('Healthy')).toBe(0);

      // A reload (or a shared link) shows the same list.
      await page.reload();
      await page.getByText(new RegExp(`^${onWatch} tanks? for \\d+ clients?$`)).waitFor();
      expect(await statuses.getByRole('checkbox', { name: /^Watch/ }).isChecked()).toBe(true);
      expect(await badges('Watch')).toBe(onWatch);

      await page.getByRole('searchbox', { name: /Search/ }).fill('no tank is called this');
      await checkScreen(page, 'console-tanks-no-match', () =>
        page.getByText('No tanks match these filters').waitFor(),
      );
      await page.getByRole('link', { name: 'Clear the filters' }).click();
      await page.getByText(`${all} tanks for`, { exact: false }).waitFor();
      expect(await statuses.getByRole('checkbox', { name: /^Watch/ }).isChecked()).toBe(false);
      expect(await page.getByRole('searchbox', { name: /Search/ }).inputValue()).toBe('');
      expect(new URL(page.url()).searchParams.get('status')).toBeNull();
    });

    it('warns before adding a species that stings its neighbours, and adds it once acknowledged', async () => {
      await page.goto(`/console/tanks/${livingRoomReef}/livestock`);
      const form = page.getByRole('form', { name: 'Add livestock' });
      await form.getByRole('searchbox', { name: /Find a species/ }).fill('carpet');
      await form.getByRole('radio', { name: /Carpet anemone/ }).check();

      const warnings = form.getByRole('list', { name: 'Compatibility warnings' });
      await warnings.waitFor();
      expect(await warnings.getByText(/may sting the hammer coral/).count()).toBeGreaterThan(0);
      expect(await warnings.getByText('Serious: Stings neighbours').count()).toBeGreaterThan(0);
      const add = form.getByRole('button', { name: 'Add anyway' });
      expect(await add.isDisabled()).toBe(true);
      await checkScreen(page, 'console-livestock-warnings', () => warnings.waitFor());

      await form.getByLabel('I have read the warnings and want to add it anyway').check();
      await add.click();
      await form.getByText('Carpet anemone added to the tank.').waitFor();
      const inTank = page.getByRole('region', { name: 'In the tank' });
      await inTank.getByRole('heading', { name: 'Carpet anemone' }).waitFor();

      // Leave the demo tank as it was for the other browser tests.
      await inTank.getByRole('button', { name: 'Delete entry for Carpet anemone' }).click();
      await page
        .getByRole('dialog', { name: 'Delete the entry for Carpet anemone?' })
        .getByRole('button', { name: 'Delete entry' })
        .click();
      await inTank
        .getByRole('heading', { name: 'Carpet anemone', exact: true })
        .waitFor({ state: 'detached' });
    });

    it('converts volumes live when the unit changes in the tank editor, and creates the tank', async () => {
      await page.goto('/console/tanks/new');
      await page.getByLabel('Enter in').selectOption('us-gallons');
      await page.getByLabel(/Display tank/).fill('50');
      await page.getByText('= 189.3 litres').waitFor();
      await page.getByLabel('Enter in').selectOption('litres');
      expect(await page.getByLabel(/Display tank/).inputValue()).toBe('189.3');
      await checkScreen(page, 'console-tank-new', () =>
        page.getByRole('heading', { level: 1, name: 'New tank' }).waitFor(),
      );

      await page.getByLabel('Tank name').fill('Studio lobby nano');
      await page.getByLabel('Water').selectOption('fresh');
      await page.getByLabel(/^Style/).selectOption('planted-freshwater');
      await page.getByRole('button', { name: 'Create tank' }).click();
      await page.getByText('Tank created. Add its photos, livestock and equipment next.').waitFor();
      expect(await page.getByLabel(/Display tank/).inputValue()).toBe('189.3');
    });

    it('edits a tank, and shows its photos', async () => {
      await page.goto(`/console/tanks/${livingRoomReef}/edit`);
      await checkScreen(page, 'console-tank-edit', async () => {
        await page.getByLabel('Tank name').waitFor();
        await page.getByText('Cover photo', { exact: true }).waitFor();
      });
      expect(await page.getByLabel('Tank name').inputValue()).toBe('Living room reef');
    });

    it('records equipment on a board and outlet, shown on the map the owners see', async () => {
      await page.goto(`/console/tanks/${livingRoomReef}/equipment`);
      await checkScreen(page, 'console-equipment', () =>
        page.getByRole('heading', { name: 'Board A' }).waitFor(),
      );
    });
  });
});

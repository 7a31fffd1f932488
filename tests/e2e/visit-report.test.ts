import type { Page } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { VisitDetail, VisitSummary } from '@shared/schemas/visits';
import { demoId } from '../../api/dev/seed/index';
import {
  apiInPage,
  type BrowserSession,
  expectAxeClean,
  openBrowser,
  screenshot,
  signInAt,
} from '../helpers/browser';

/*
 * The technician's day at the tank, on a 390 px phone: today's visit opened from the schedule,
 * tasks ticked, a 20 % water change on the 300 + 80 L living room reef (76 L), two readings and a
 * photo, a stretch with no connection while typing, back online and saved, an item for next time,
 * published; the owner is told and reads it on the tank page; the next report carries the item.
 */

const tankId = demoId('ashdown-reef');
const tankName = 'Living room reef';

/** Today in the tank's zone (Europe/London for the demo company) as YYYY-MM-DD. */
const todayInLondon = () =>
  new Intl.DateTimeFormat('en-CA', {
    timeZone: 'Europe/London',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).format(new Date());

describe('a visit report written on a phone', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(() => session.close());

  it('survives a lost connection, publishes, reaches the owner and carries its item to the next visit', async () => {
    const page = await signInAt(await session.newPage('phone'), '/console/schedule', 'tomas@driftglass.test');
    const today = todayInLondon();
    const visit = await apiInPage<VisitSummary>(page, 'POST', '/visits', {
      tankId,
      kind: 'routine',
      date: today,
      startTime: '00:00',
      endTime: '23:59',
    });

    // Today's schedule lists it; the technician opens it from there.
    await page.reload();
    const card = page.locator(`a[href="/visits/${visit.id}"]`).first();
    await card.waitFor();
    await card.click();
    await page.waitForURL(`**/visits/${visit.id}`);
    await page.getByRole('heading', { level: 1, name: tankName }).waitFor();
    await expectAxeClean(page, 'the new report');

    await page
      .getByRole('region', { name: 'Time on site' })
      .getByRole('button', { name: 'Now' })
      .first()
      .click();
    const tasks = page.getByRole('group', { name: 'Tasks' });
    await tasks.getByLabel('Water change').check();
    await tasks.getByLabel('Cleaned the glass').check();
    await tasks.getByLabel('Emptied and cleaned the skimmer cup').check();

    await page.getByLabel('Share').fill('20');
    await expect.poll(() => page.getByLabel('Volume').inputValue()).toBe('76');
    await page.getByLabel('New water’s salinity').fill('35');

    const readings = page.getByRole('region', { name: 'Readings taken' });
    await readings.getByRole('button', { name: 'Add a reading' }).click();
    await readings.getByLabel('Parameter').nth(0).selectOption('temperature');
    await readings.getByLabel('Value').nth(0).fill('25.4');
    await readings.getByLabel('Unit').nth(0).selectOption({ index: 0 });
    await readings.getByRole('button', { name: 'Add a reading' }).click();
    await readings.getByLabel('Parameter').nth(1).selectOption('alkalinity');
    await readings.getByLabel('Value').nth(1).fill('8.1');
    await readings.getByLabel('Unit').nth(1).selectOption('dKH');

    const picture = await sharp({
      create: { width: 64, height: 48, channels: 3, background: { r: 20, g: 120, b: 140 } },
    })
      .png()
      .toBuffer();
    await page
      .getByLabel('After photo')
      .setInputFiles({ name: 'after.png', mimeType: 'image/png', buffer: picture });
    await page.getByRole('img', { name: 'After the visit, 1' }).waitFor();

    const state = page.getByRole('main').locator('header [role="status"]');
    await expect.poll(() => state.textContent(), { timeout: 30_000 }).toBe('Saved');

    // No connection: typing goes on, kept on the phone.
    await page.context().setOffline(true);
    await page
      .getByLabel('Notes', { exact: true })
      .fill('Glass cleaned inside and out. Skimmer cup was **very** full.');
    await expect.poll(() => state.textContent(), { timeout: 30_000 }).toBe('Offline — kept on this phone');
    await page.getByLabel('Notes', { exact: true }).press('End');
    await page.getByLabel('Notes', { exact: true }).type(' Return pump sounds fine.');
    await screenshot(page, 'visit-report-offline-phone');

    // Back online: what waited is saved.
    await page.context().setOffline(false);
    await expect.poll(() => state.textContent(), { timeout: 30_000 }).toBe('Saved');
    const saved = await apiInPage<VisitDetail>(page, 'GET', `/visits/${visit.id}`);
    expect(saved.draft?.notes).toBe(
      'Glass cleaned inside and out. Skimmer cup was **very** full. Return pump sounds fine.',
    );
    expect(saved.draft?.waterChange).toMatchObject({ percent: 20, litres: 76, newSalinityPpt: 35 });
    expect(saved.draft?.readings).toHaveLength(2);
    expect(saved.draft?.photos).toHaveLength(1);

    await page.getByRole('button', { name: 'Add an item for next time' }).click();
    await page.getByLabel('Item 1').fill('Check the left wave pump impeller');
    await expect.poll(() => state.textContent(), { timeout: 30_000 }).toBe('Saved');
    await expectAxeClean(page, 'the filled-in report');
    await screenshot(page, 'visit-report-filled-phone');

    await page.getByRole('button', { name: 'Publish report' }).click();
    await page.getByText('The owners have been told.').waitFor({ timeout: 30_000 });
    const published = await apiInPage<VisitDetail>(page, 'GET', `/visits/${visit.id}`);
    expect(published.status).toBe('published');
    const stored = await apiInPage<{ readings: { source: string; parameter: string }[] }>(
      page,
      'GET',
      `/tanks/${tankId}/readings/list?source=visit&limit=20`,
    );
    expect(stored.readings.filter((r) => r.source === 'visit').map((r) => r.parameter)).toEqual(
      expect.arrayContaining(['temperature', 'alkalinity']),
    );

    // The owner is told and reads it on the tank page.
    const owner = await signInAt(
      await session.newPage('phone'),
      `/tanks/${tankId}`,
      'helen@ashdown-home.test',
    );
    await expect
      .poll(
        async () => {
          const inbox = await apiInPage<{ items: { title: string; link: string }[] }>(
            owner,
            'GET',
            '/notifications',
          );
          return inbox.items.some((n) => n.link.includes(visit.id));
        },
        { timeout: 60_000, interval: 1000 },
      )
      .toBe(true);
    await owner.goto(`/tanks/${tankId}?section=visits&visit=${visit.id}`);
    const report = owner.getByRole('main');
    await report.getByText('Return pump sounds fine.', { exact: false }).first().waitFor();
    await report.getByText('76 L', { exact: false }).first().waitFor();
    await expectAxeClean(owner, "the owner's visit report");
    await screenshot(owner, 'visit-report-owner-phone');

    // The next report starts with the carried item on its checklist.
    const next = await apiInPage<VisitSummary>(page, 'POST', '/visits', {
      tankId,
      kind: 'routine',
      date: today,
      startTime: '00:00',
      endTime: '23:59',
    });
    await page.goto(`/visits/${next.id}`);
    await page.getByRole('heading', { level: 1, name: tankName }).waitFor();
    await page
      .getByRole('group', { name: 'Open items' })
      .getByLabel('Check the left wave pump impeller')
      .waitFor();
    // Leave the demo as it was found: the extra visit is cancelled.
    await apiInPage(page, 'PATCH', `/visits/${next.id}`, { cancelled: true });
  });
  it('shows both versions when the same report was changed on two devices, and keeps the one chosen', async () => {
    const phone = await signInAt(
      await session.newPage('phone'),
      '/console/schedule',
      'tomas@driftglass.test',
    );
    const tablet = await signInAt(
      await session.newPage('desktop'),
      '/console/schedule',
      'tomas@driftglass.test',
    );
    const visit = await apiInPage<VisitSummary>(phone, 'POST', '/visits', {
      tankId,
      kind: 'routine',
      date: todayInLondon(),
      startTime: '00:00',
      endTime: '23:59',
    });
    const stateOf = (page: Page) => page.getByRole('main').locator('header [role="status"]');
    // Both open the report at the same version.
    for (const page of [phone, tablet]) {
      await page.goto(`/visits/${visit.id}`);
      await page.getByRole('heading', { level: 1, name: tankName }).waitFor();
    }
    await tablet.getByLabel('Notes', { exact: true }).fill('Written on the tablet.');
    await expect.poll(() => stateOf(tablet).textContent(), { timeout: 30_000 }).toBe('Saved');

    await phone.getByLabel('Notes', { exact: true }).fill('Written on the phone.');
    const chooser = phone.getByRole('alert').filter({ hasText: 'also changed on another device' });
    await chooser.waitFor({ timeout: 30_000 });
    await chooser.getByText('Written on the tablet.').waitFor();
    await chooser.getByText('Written on the phone.').waitFor();
    expect((await apiInPage<VisitDetail>(phone, 'GET', `/visits/${visit.id}`)).draft?.notes).toBe(
      'Written on the tablet.',
    );
    await expectAxeClean(phone, 'the version chooser');
    await screenshot(phone, 'visit-report-conflict-phone');

    await chooser.getByRole('button', { name: 'Keep this phone’s version' }).click();
    await expect.poll(() => stateOf(phone).textContent(), { timeout: 30_000 }).toBe('Saved');
    expect((await apiInPage<VisitDetail>(phone, 'GET', `/visits/${visit.id}`)).draft?.notes).toBe(
      'Written on the phone.',
    );
    await apiInPage(phone, 'PATCH', `/visits/${visit.id}`, { cancelled: true });
  });
});

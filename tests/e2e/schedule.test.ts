import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EquipmentItem } from '@shared/schemas/equipment';
import type { AssignableStaff } from '@shared/schemas/tanks';
import type { VisitDetail, VisitSummary } from '@shared/schemas/visits';
import { demoId } from '../../api/dev/seed/index';
import {
  axeViolations,
  openBrowser,
  screenshot,
  signInAt,
  viewports,
  type BrowserSession,
  apiInPage,
} from '../helpers/browser';

/*
 * Service visits outside the report itself: a technician's day on a 390 px phone, an admin giving a
 * visit to someone else and cancelling it, and a client reading a published report on the tank page
 * and printing it. Each test makes its own visits through the API.
 */

// The demo company works in London; the browsers are put there too, so "today" is the same day.
const zone = 'Europe/London';
const lagoon = demoId('saltfig-lagoon');
const riverTank = demoId('ashdown-river');

const dayInZone = (at: Date) =>
  new Intl.DateTimeFormat('en-CA', {
    timeZone: zone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).format(at);
const today = () => dayInZone(new Date());
const tomorrow = () => dayInZone(new Date(Date.now() + 86_400_000));

async function newPage(session: BrowserSession, viewport: keyof typeof viewports): Promise<Page> {
  const context = await session.browser.newContext({
    viewport: viewports[viewport],
    baseURL: session.baseUrl,
    timezoneId: zone,
  });
  return context.newPage();
}

/** The card of one visit in a schedule list. */
const cardOf = (page: Page, visitId: string): Locator =>
  page.locator('article').filter({ has: page.locator(`a[href="/visits/${visitId}"]`) });

/** No axe findings and nothing wider than the screen, at both sizes, with a screenshot of each. */
async function checkScreen(page: Page, name: string, ready: () => Promise<unknown>) {
  for (const viewport of ['phone', 'desktop'] as const) {
    await page.setViewportSize(viewports[viewport]);
    await ready();
    expect(await axeViolations(page), `${name} at ${viewport}`).toEqual([]);
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow, `${name} at ${viewport} scrolls sideways`).toBeLessThanOrEqual(0);
    await screenshot(page, `${name}-${viewport}`);
  }
  await page.setViewportSize(viewports.phone);
}

describe('the schedule and visit reports in the browser', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(() => session.close());

  it("shows a technician today's visits on a phone, each opening its report", async () => {
    const page = await signInAt(
      await newPage(session, 'phone'),
      '/console/schedule',
      'tomas@driftglass.test',
    );
    const visit = await apiInPage<VisitSummary>(page, 'POST', '/visits', {
      tankId: lagoon,
      kind: 'equipment',
      date: today(),
      startTime: '12:00',
      endTime: '13:30',
      note: 'Bring the spare return pump.',
    });

    await page.reload();
    await page.getByRole('heading', { level: 1, name: 'My day' }).waitFor();
    const card = cardOf(page, visit.id);
    await checkScreen(page, 'schedule-technician-day', () => card.waitFor());
    expect(await page.getByRole('heading', { level: 2 }).filter({ hasText: 'Today' }).count()).toBe(1);
    expect(await card.getByText('12:00–13:30').count()).toBe(1);
    expect(await card.getByText('Equipment work').count()).toBe(1);
    expect(await card.getByText('Bring the spare return pump.').count()).toBe(1);
    expect(await card.getByText('Start report').count()).toBe(1);
    // A technician plans and works their own visits; reassigning is an admin's.
    expect(await page.getByRole('navigation', { name: 'Whose schedule' }).count()).toBe(0);
    expect(await card.getByRole('button', { name: /Reassign/ }).count()).toBe(0);
    const box = await card.boundingBox();
    expect(box?.height ?? 0, 'a card is a large target').toBeGreaterThanOrEqual(120);

    // The week, with today marked, is one tap away and keeps its place in the address.
    await page.getByRole('group', { name: 'Show' }).getByText('Week').click();
    await page.getByRole('heading', { level: 1, name: 'My week' }).waitFor();
    expect(new URL(page.url()).searchParams.get('view')).toBe('week');
    await checkScreen(page, 'schedule-technician-week', () => card.waitFor());

    // A day with nothing planned says so.
    await page.goto('/console/schedule?view=day&day=2020-01-06');
    await checkScreen(page, 'schedule-technician-empty', () =>
      page.getByText('No visits on Mon 6 Jan').waitFor(),
    );

    // Planning a visit: the form goes to the day it was planned for, where the new visit shows.
    await page.goto('/console/schedule');
    await page.getByRole('button', { name: 'Plan a visit' }).click();
    const form = page.getByRole('form', { name: 'Plan a visit' });
    await form.getByRole('button', { name: 'Plan the visit' }).click();
    await form.getByText('choose a tank', { exact: true }).waitFor();
    await form
      .getByLabel('Tank', { exact: true })
      .selectOption({ label: 'Dining room lagoon — Salt Fig Kitchen — dining room' });
    await form.getByText('Every 7 days from this day', { exact: false }).waitFor();
    await form.getByLabel('Day', { exact: true }).fill(tomorrow());
    await form.getByLabel('From', { exact: true }).fill('08:00');
    await form.getByLabel('To', { exact: true }).fill('08:45');
    await form.getByLabel('Note for the visit').fill('Before the kitchen opens.');
    await checkScreen(page, 'schedule-plan-visit', () => form.waitFor());
    await form.getByRole('button', { name: 'Plan the visit' }).click();
    await page.getByText('Planned: Dining room lagoon', { exact: false }).waitFor();
    expect(new URL(page.url()).searchParams.get('day')).toBe(tomorrow());
    const planned = await apiInPage<VisitSummary[]>(
      page,
      'GET',
      `/visits?from=${tomorrow()}&to=${tomorrow()}&technicianId=me`,
    );
    const mine = planned.find((candidate) => candidate.note === 'Before the kitchen opens.');
    expect(mine).toMatchObject({ tankId: lagoon, kind: 'routine', repeats: false });
    await cardOf(page, mine!.id).getByText('08:00–08:45').waitFor();

    await page.goto(`/console/schedule?day=${today()}`);
    await card.getByRole('link').click();
    await page.waitForURL(`**/visits/${visit.id}`);
    for (const id of [visit.id, mine!.id])
      await apiInPage(page, 'PATCH', `/visits/${id}`, { cancelled: true });
    await page.context().close();
  });

  it('lets an admin give a visit to another technician, cancel it and restore it', async () => {
    const page = await signInAt(
      await newPage(session, 'desktop'),
      '/console/schedule',
      'mara@driftglass.test',
    );
    const staff = await apiInPage<AssignableStaff[]>(page, 'GET', '/tanks/technicians');
    const tomas = staff.find((person) => person.name === 'Tomas Lindqvist')!;
    const visit = await apiInPage<VisitSummary>(page, 'POST', '/visits', {
      tankId: lagoon,
      kind: 'routine',
      technicianId: tomas.id,
      date: today(),
      startTime: '15:00',
      endTime: '16:00',
    });

    await page.reload();
    // An admin opens on everyone's visits.
    await page.getByRole('heading', { level: 1, name: 'Schedule' }).waitFor();
    const card = cardOf(page, visit.id);
    await card.getByText('Tomas Lindqvist').waitFor();

    await card.getByRole('button', { name: /^Reassign/ }).click();
    const dialog = page.getByRole('dialog', { name: 'Reassign the visit' });
    await dialog.getByLabel('Technician').selectOption({ label: 'Priya Raman' });
    expect(await axeViolations(page), 'axe with the reassign dialog open').toEqual([]);
    await screenshot(page, 'schedule-admin-reassign-desktop');
    await dialog.getByRole('button', { name: 'Reassign' }).click();
    await card.getByText('Priya Raman').waitFor();
    expect((await apiInPage<VisitDetail>(page, 'GET', `/visits/${visit.id}`)).technician?.name).toBe(
      'Priya Raman',
    );

    // Only her visits, through the technician filter.
    await page.getByRole('search', { name: 'Whose visits' }).getByLabel('Technician').selectOption({
      label: 'Priya Raman',
    });
    await page.waitForURL((url) => url.searchParams.get('who') !== 'everyone');
    await card.waitFor();
    await checkScreen(page, 'schedule-admin-everyone', () => card.waitFor());

    await card.getByRole('button', { name: /^Cancel visit/ }).click();
    const confirm = page.getByRole('dialog', { name: 'Cancel this visit?' });
    await confirm.getByRole('button', { name: 'Cancel visit' }).click();
    await card.getByText('Cancelled', { exact: true }).first().waitFor();
    expect((await apiInPage<VisitDetail>(page, 'GET', `/visits/${visit.id}`)).status).toBe('cancelled');

    await card.getByRole('button', { name: 'Restore visit' }).click();
    await card.getByText('Start report').waitFor();
    expect((await apiInPage<VisitDetail>(page, 'GET', `/visits/${visit.id}`)).status).toBe('scheduled');
    await apiInPage(page, 'PATCH', `/visits/${visit.id}`, { cancelled: true });

    // The tank list says when each tank was last visited, and flags one past its service interval.
    await page.goto('/console?technicianId=everyone');
    await checkScreen(page, 'console-tanks-last-visit', () =>
      page.getByText(/^\d+ tanks for \d+ clients$/).waitFor(),
    );
    expect(await page.getByText('Last visit:').count()).toBeGreaterThan(0);
    await page.context().close();
  });

  it('shows a client the published report on the tank page, ready to print', async () => {
    const technician = await signInAt(
      await newPage(session, 'phone'),
      '/console/schedule',
      'tomas@driftglass.test',
    );
    const [pump] = await apiInPage<EquipmentItem[]>(technician, 'GET', `/tanks/${riverTank}/equipment`);
    const now = Date.now();
    const visit = await apiInPage<VisitSummary>(technician, 'POST', '/visits', {
      tankId: riverTank,
      kind: 'routine',
      date: today(),
      startTime: '00:00',
      endTime: '23:59',
    });
    const saved = await apiInPage<VisitDetail>(technician, 'PUT', `/visits/${visit.id}/report`, {
      version: 0,
      content: {
        arrivedAt: new Date(now - 60 * 60_000).toISOString(),
        departedAt: new Date(now - 5 * 60_000).toISOString(),
        tasksDone: ['water-change', 'glass', 'equipment-check'],
        waterChange: { percent: 25, litres: 30 },
        dosingRefills: [{ container: 'Liquid plant food', amountMl: 250 }],
        equipmentChecks: pump
          ? [{ equipmentId: pump.id, state: 'needs-attention', note: 'Impeller rattles.' }]
          : [],
        readings: [
          {
            parameter: 'temperature',
            value: 24.6,
            unit: '°C',
            measuredAt: new Date(now - 30 * 60_000).toISOString(),
          },
        ],
        notes: 'Java fern trimmed at the back.\nThe cat was on the lid again.',
        nextItems: ['Bring a new impeller'],
        nextVisit: { date: tomorrow(), startTime: '09:00', endTime: '10:00' },
      },
    });
    await apiInPage(technician, 'POST', `/visits/${visit.id}/publish`, { version: saved.version });
    // Staff see, beside the reports, what is planned and what this visit left for the next one.
    await technician.goto(`/tanks/${riverTank}?section=visits`);
    const carried = technician.getByRole('region', { name: 'Carried to the next visit' });
    await checkScreen(technician, 'tank-visits-staff', () =>
      carried.getByText('Bring a new impeller').waitFor(),
    );
    expect(
      await technician.getByRole('region', { name: 'Planned and in progress' }).getByRole('link').count(),
    ).toBeGreaterThan(0);
    await technician.context().close();

    // The client follows the link a notification carries.
    const path = `/tanks/${riverTank}`;
    const owner = await signInAt(await newPage(session, 'phone'), path, 'helen@ashdown-home.test');
    await owner.getByText('Next visit:').waitFor();
    await owner.goto(`${path}?section=visits&visit=${visit.id}`);
    const report = owner.locator('[data-print-report]');
    await checkScreen(owner, 'tank-visit-report', () =>
      report.getByText('Java fern trimmed at the back.', { exact: false }).waitFor(),
    );
    expect(await report.getByText('Water change:').count()).toBe(1);
    expect(await report.getByText('25 % (30 L)', { exact: false }).count()).toBe(1);
    expect(await report.getByText('Liquid plant food: 250 mL').count()).toBe(1);
    expect(await report.getByText('Tomas Lindqvist').count()).toBeGreaterThan(0);
    expect(await report.getByText('Bring a new impeller').count()).toBe(1);
    expect(await report.getByText('24.6 °C').count()).toBe(1);
    if (pump) expect(await report.getByText('Needs attention').count()).toBe(1);
    // The notes keep their line breaks (Markdown, rendered with a <br> for each).
    const notes = report.getByText('The cat was on the lid again.', { exact: false });
    expect(await notes.evaluate((element) => (element as HTMLElement).innerText)).toBe(
      'Java fern trimmed at the back.\nThe cat was on the lid again.',
    );

    // Printed: only the report, with the company, the tank and the date; no app around it, no buttons.
    const print = report.getByRole('button', { name: /^Print/ });
    expect(await print.isVisible()).toBe(true);
    await owner.emulateMedia({ media: 'print' });
    expect(await report.getByText("Visit report: Kids' river tank").isVisible()).toBe(true);
    expect(await report.getByText('Driftglass Aquatic Care').isVisible()).toBe(true);
    expect(await print.isVisible()).toBe(false);
    expect(await owner.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false);
    expect(await owner.getByRole('navigation', { name: 'Tank sections' }).isVisible()).toBe(false);
    expect(await owner.getByText('Next visit', { exact: true }).isVisible()).toBe(false);
    const ink = await report.evaluate((element) => getComputedStyle(element).color);
    expect(ink).toBe('rgb(0, 0, 0)');
    await screenshot(owner, 'tank-visit-report-print');
    await owner.emulateMedia({ media: 'screen' });
    await owner.context().close();
  });
});

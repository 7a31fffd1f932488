import pg from 'pg';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { connectDatabase } from '../../api/db/client';
import { demoId } from '../../api/dev/seed/index';
import { seedDemoReadings } from '../../api/dev/seed/readings';
import { demoPassword } from '../../api/dev/demo-people';
import { axeViolations, openBrowser, screenshot, type BrowserSession } from '../helpers/browser';

const quaysideReef = demoId('quayside-reef');

/**
 * The demo history normally comes with the demo seed; this writes it when the seed has not done so
 * (seedDemoReadings is idempotent, so it does nothing when the history is there).
 */
async function ensureDemoReadings() {
  const base = inject('postgresBaseUrl');
  const admin = new pg.Client({ connectionString: `${base}/postgres` });
  await admin.connect();
  let names: string[];
  try {
    names = (
      await admin.query<{ datname: string }>(`select datname from pg_database where datname like 'test_%'`)
    ).rows.map((row) => row.datname);
  } finally {
    await admin.end();
  }
  for (const name of names) {
    const database = connectDatabase(`${base}/${name}`, { max: 2 });
    try {
      const demo = await database.pool.query('select 1 from tanks where id = $1', [quaysideReef]);
      if (demo.rowCount) await seedDemoReadings(database.db, new Date());
    } finally {
      await database.pool.end();
    }
  }
}

async function signInAt(page: Page, path: string, email: string) {
  await page.goto(path);
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill(demoPassword);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => url.pathname === path);
}

/** The tank page opens on its summary; the readings, charts and staff tools are a section of it. */
async function openReadings(page: Page) {
  await page
    .getByRole('navigation', { name: 'Tank sections' })
    .getByRole('link', { name: 'Readings and charts' })
    .click();
  await page.waitForURL((url) => url.searchParams.get('section') === 'readings');
}

const caption = (page: Page) => page.locator('figcaption');

async function chartDrawn(page: Page) {
  await page.getByTestId('readings-chart').locator('canvas').waitFor();
  // The chart draws on the next frame after its data arrives.
  await page.waitForTimeout(300);
}

describe('tank readings, charts and limits', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    await ensureDemoReadings();
    session = await openBrowser();
  });
  afterAll(() => session.close());

  it('lets the owner open a chart with its limit bands, switch range and unit, on a phone', async () => {
    const page = await session.newPage('phone');
    await signInAt(page, `/tanks/${quaysideReef}`, 'felix@quayside-dental.test');
    await openReadings(page);

    await page.getByRole('heading', { name: 'Water readings' }).waitFor();
    const temperatureTile = page.getByRole('button', { name: /^Temperature/ });
    await temperatureTile.waitFor();
    expect(await temperatureTile.getAttribute('aria-pressed')).toBe('true');
    await chartDrawn(page);
    await expect.poll(() => caption(page).textContent()).toContain('over the last 7 days');
    expect(await page.getByTestId('chart-bands').textContent()).toMatch(
      /Shaded bands: Warning outside .+ °C/,
    );
    // The livestock's own range is drawn beside the tank's limits, with the species that set it.
    await expect
      .poll(() => page.getByTestId('chart-livestock').textContent())
      .toMatch(/Dotted lines: what the livestock tolerate together, \d+\.\d–\d+\.\d °C \(set by the .+\)\./);
    // Owners get the home-test form, not the staff tools.
    await page.getByRole('heading', { name: 'Add readings' }).waitFor();
    expect(await page.getByRole('heading', { name: 'Limits' }).count()).toBe(0);
    expect(await page.getByRole('heading', { name: 'Devices' }).count()).toBe(0);
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'readings-owner-phone');

    await page.getByRole('group', { name: 'Period' }).getByText('30 d').click();
    await expect.poll(() => caption(page).textContent()).toContain('over the last 30 days');
    await page.getByLabel('Unit', { exact: true }).selectOption('°F');
    await expect.poll(() => page.getByTestId('chart-bands').textContent()).toMatch(/°F/);
    await chartDrawn(page);
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'readings-owner-phone-30d-fahrenheit');
  });

  it('shows the heater failing on the 90-day chart and salinity as specific gravity, on a desktop', async () => {
    const page = await session.newPage('desktop');
    await signInAt(page, `/tanks/${quaysideReef}`, 'felix@quayside-dental.test');
    await openReadings(page);
    await page.getByRole('heading', { name: 'Water readings' }).waitFor();

    await page.getByRole('group', { name: 'Period' }).getByText('90 d').click();
    await expect.poll(() => caption(page).textContent()).toContain('over the last 90 days');
    await chartDrawn(page);
    // The heater story: the lowest temperature of the window is below the critical bound.
    const stats = page.getByRole('group', { name: /Temperature over/ });
    const lowest = await stats
      .locator('div', { has: page.locator('dt', { hasText: /^Lowest$/ }) })
      .locator('dd')
      .textContent();
    expect(Number.parseFloat(lowest ?? '')).toBeLessThan(22.5);
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'readings-owner-desktop-90d');

    await page.getByRole('button', { name: /^Salinity/ }).click();
    await page.getByLabel('Unit', { exact: true }).selectOption('specific gravity');
    await page.getByRole('group', { name: 'Period' }).getByText('1 year').click();
    await expect.poll(() => caption(page).textContent()).toContain('Salinity over the last year');
    await expect.poll(() => page.getByTestId('chart-bands').textContent()).toMatch(/1\.02\d\d SG/);
    await chartDrawn(page);
    await screenshot(page, 'readings-owner-desktop-salinity-sg');
  });

  it('lets the owner record a home test and see it saved', async () => {
    const page = await session.newPage('phone');
    await signInAt(page, `/tanks/${quaysideReef}`, 'felix@quayside-dental.test');
    await openReadings(page);
    const form = page.locator('form', { has: page.getByRole('heading', { name: 'Add readings' }) });
    await form.waitFor();
    const nitrate = form.getByTestId('entry-nitrate');
    await nitrate.getByRole('textbox').fill('7,5');
    await expect.poll(() => nitrate.textContent()).toContain('Saved as 7.5 mg/L NO3');
    await form.getByRole('button', { name: 'Save reading' }).click();

    await form.getByRole('status').filter({ hasText: 'Saved 1 reading' }).waitFor();
    expect(await axeViolations(page)).toEqual([]);
  });

  it('gives staff the limits editor and the devices on the same page', async () => {
    const page = await session.newPage('desktop');
    await signInAt(page, `/tanks/${quaysideReef}`, 'priya@driftglass.test');
    await openReadings(page);
    await page.getByRole('heading', { name: 'Limits' }).waitFor();
    await page.getByRole('heading', { name: 'Devices' }).waitFor();
    const devices = page.getByRole('region', { name: 'Devices' });
    await devices.getByRole('listitem').filter({ hasText: 'Sump controller' }).waitFor();
    const temperature = page.getByTestId('limits-temperature');
    await temperature
      .getByText('Comfort range')
      .or(temperature.getByText('No comfort range'))
      .first()
      .waitFor();
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'readings-staff-desktop');

    await page.getByRole('group', { name: 'Show as' }).getByText('Table').click();
    await page.getByRole('table', { name: 'Readings, newest first' }).waitFor();
    expect(
      await page.getByRole('link', { name: 'Download these readings (CSV)' }).getAttribute('href'),
    ).toContain(`/api/tanks/${quaysideReef}/readings/export?parameter=`);

    // CSV import: the preview names each bad row by its line, and nothing goes in until all are fine.
    const upload = page.getByLabel('CSV file', { exact: true });
    const at = (minutesAgo: number) => new Date(Date.now() - minutesAgo * 60_000).toISOString();
    const csv = (rows: string[]) => ({
      name: 'kit-results.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(['measured_at,parameter,value,unit,source,note', ...rows].join('\n')),
    });
    await upload.setInputFiles(
      csv([`${at(90)},calcium,430,mg/L,visit,`, `${at(80)},calcium,4300,mg/L,visit,typo`]),
    );
    await page.getByText('1 needs fixing before anything is imported.', { exact: false }).waitFor();
    await page.getByText(/value: Calcium 4300 mg\/L is outside what a tank can plausibly read/).waitFor();
    expect(await page.getByRole('button', { name: 'Import 2 readings' }).isDisabled()).toBe(true);
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'readings-staff-table-desktop');

    await upload.setInputFiles(
      csv([`${at(90)},calcium,430,mg/L,visit,`, `${at(80)},calcium,43.0,mg/L,visit,typo`]),
    );
    await page.getByText('2 readings read, all ready to import.').waitFor();
  });
});

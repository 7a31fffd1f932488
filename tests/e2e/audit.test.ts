import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  axeViolations,
  openBrowser,
  screenshot,
  viewports,
  type BrowserSession,
  signInAt,
} from '../helpers/browser';

// The e2e database is shared by every browser test file in a run: each change made here is undone here.
describe('the audit trail screen', () => {
  let session: BrowserSession;
  let page: Page;

  beforeAll(async () => {
    session = await openBrowser();
    page = await session.newPage('desktop');
    await signInAt(page, '/console/staff', 'mara@driftglass.test');
  });
  afterAll(() => session.close());

  it("lists the admin's own sign-in, reached from the console's navigation", async () => {
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Audit trail' }).click();
    await page.waitForURL(/\/console\/audit$/);
    await page.getByRole('heading', { level: 1, name: 'Audit trail' }).waitFor();

    const table = page.getByRole('table', { name: 'Audit trail, newest first' });
    const signIn = table
      .getByRole('row')
      .filter({ hasText: 'Signed in' })
      .filter({ hasText: 'Mara Okonkwo-Hale' });
    await signIn.first().waitFor();
    expect(await signIn.first().textContent()).toMatch(/\d{1,2} [A-Z][a-z]{2} \d{4}, \d\d:\d\d/);
  });

  it('shows a role change with what it was and what it became, and finds it by filter', async () => {
    await page.goto('/console/staff');
    const team = page.getByRole('region', { name: 'Team' });
    const priya = team.getByRole('listitem').filter({ hasText: 'Priya Raman' });
    await priya.getByRole('button', { name: 'Make admin Priya Raman' }).click();
    await team.getByText('Priya Raman is now an admin.').waitFor();
    await priya.getByRole('button', { name: 'Make technician Priya Raman' }).click();
    await team.getByText('Priya Raman is now a technician.').waitFor();

    await page.goto('/console/audit');
    const filters = page.getByRole('form', { name: 'Filter the audit trail' });
    await filters.getByLabel('What happened').selectOption({ label: 'Changed a role' });
    await filters.getByLabel('Who').fill('mara');

    const rows = page.getByRole('table', { name: 'Audit trail, newest first' }).getByRole('row');
    const newest = rows.filter({ hasText: 'Priya Raman' }).first();
    await newest.getByText('was admin').waitFor();
    expect(await newest.textContent()).toContain('now technician');
    expect(await rows.filter({ hasText: 'Signed in' }).count()).toBe(0);

    const href = await page.getByRole('link', { name: 'Download CSV' }).getAttribute('href');
    expect(href).toBe('/api/audit/export?action=user.role-changed&actor=mara');
    const csv = await page.evaluate(async (url) => (await fetch(url)).text(), href!);
    expect(csv.split('\r\n')[0]).toMatch(/^at,action,actor_name/);
    expect(csv).toContain('user.role-changed,Mara Okonkwo-Hale');
    expect(csv).toContain('Priya Raman');
  });

  it('passes axe at phone and desktop widths, as a table on a desktop and cards on a phone', async () => {
    for (const viewport of ['phone', 'desktop'] as const) {
      await page.setViewportSize(viewports[viewport]);
      const list =
        viewport === 'phone'
          ? page.getByRole('list', { name: 'Audit trail, newest first' })
          : page.getByRole('table', { name: 'Audit trail, newest first' });
      await list.getByText('now technician').first().waitFor();
      expect(await axeViolations(page)).toEqual([]);
      await screenshot(page, `console-audit-${viewport}`);
    }
  });

  it('says so in plain words when nothing matches', async () => {
    const filters = page.getByRole('form', { name: 'Filter the audit trail' });
    await filters.getByLabel('From').fill('2099-01-01');

    await page.getByText('Nothing matches these filters').waitFor();
    expect(await page.getByRole('table', { name: 'Audit trail, newest first' }).count()).toBe(0);
  });

  it('is not offered to a technician', async () => {
    const technician = await signInAt(await session.newPage('phone'), '/console', 'priya@driftglass.test');
    await technician
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Alerts' })
      .waitFor();

    expect(await technician.getByRole('link', { name: 'Audit trail' }).count()).toBe(0);
    const answer = await technician.evaluate(async () => (await fetch('/api/audit')).status);
    expect(answer).toBe(403);
    await technician.context().close();
  });
});

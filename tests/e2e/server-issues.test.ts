import { randomUUID } from 'node:crypto';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { axeViolations, openBrowser, type BrowserSession, signInAt } from '../helpers/browser';

/** The text the field points at with aria-describedby: its hint and, when it has one, its problem. */
async function describedText(field: Locator): Promise<string> {
  return field.evaluate((element) =>
    (element.getAttribute('aria-describedby') ?? '')
      .split(/\s+/)
      .filter(Boolean)
      .map((id) => document.getElementById(id)?.textContent ?? '')
      .join(' '),
  );
}

// Nothing here is saved: the one refused request leaves the shared e2e database as it was.
describe('a 400 from the API shows each problem under its own field', () => {
  let session: BrowserSession;
  let page: Page;

  beforeAll(async () => {
    session = await openBrowser();
    page = await session.newPage('desktop');
    await signInAt(page, '/console/staff', 'mara@driftglass.test');
  });
  afterAll(() => session.close());

  it('puts the e-mail and name problems of a refused staff invitation beside those fields', async () => {
    // The client's mapping is what is tested, so the API's answer is given here.
    await page.route('**/api/invitations', (route) =>
      route.request().method() === 'POST'
        ? route.fulfill({
            status: 400,
            json: {
              error: {
                code: 'invalid_request',
                message: 'Some fields need attention.',
                issues: [
                  { path: 'body.email', message: 'This address is already on the team.' },
                  { path: 'body.name', message: 'Give the name as it should appear in the e-mail.' },
                ],
              },
            },
          })
        : route.continue(),
    );
    const form = page.getByRole('region', { name: 'Invite a staff member' });
    const email = form.getByLabel('E-mail address');
    const name = form.getByLabel('Name (optional)');
    await email.fill('priya@driftglass.test');
    await name.fill('Priya');
    await form.getByRole('button', { name: 'Send invitation' }).click();

    await form.getByText('This address is already on the team.').waitFor();
    expect(await email.getAttribute('aria-invalid')).toBe('true');
    expect(await describedText(email)).toContain('This address is already on the team.');
    expect(await name.getAttribute('aria-invalid')).toBe('true');
    expect(await describedText(name)).toContain('Give the name as it should appear in the e-mail.');
    expect(await describedText(name)).not.toContain('already on the team');
    expect(await email.evaluate((input) => input === document.activeElement)).toBe(true);
    // Every issue found its field, so nothing is left for the form-wide problem.
    expect(await form.getByText('Some fields need attention.').count()).toBe(0);
    expect(await axeViolations(page)).toEqual([]);
    await page.unroute('**/api/invitations');
  });

  it('puts the API’s own refusal of someone who is not on the staff under “Who” on the roster', async () => {
    // The list offers one person the company does not employ; the real API then refuses the shift.
    await page.route('**/api/staff', async (route) => {
      const response = await route.fetch();
      const staff = (await response.json()) as object[];
      await route.fulfill({
        status: 200,
        json: [
          ...staff,
          {
            id: randomUUID(),
            name: 'Casey Outsider',
            email: 'casey@elsewhere.test',
            role: 'technician',
            status: 'active',
          },
        ],
      });
    });
    await page.goto('/console/alerts');
    const roster = page.getByRole('region', { name: 'On-call roster' });
    const who = roster.getByLabel('Who');
    await who.selectOption({ label: 'Casey Outsider' });
    await roster.getByRole('button', { name: 'Add shift' }).click();

    await roster.getByText('Not a member of your staff.').waitFor();
    expect(await who.getAttribute('aria-invalid')).toBe('true');
    expect(await describedText(who)).toContain('Not a member of your staff.');
    expect(await roster.getByLabel('Starts').getAttribute('aria-invalid')).toBeNull();
    expect(await roster.getByText('Choose an active member of staff.').count()).toBe(0);
    expect(await roster.getByText('Nobody is on call.').isVisible()).toBe(true);
    expect(await axeViolations(page)).toEqual([]);
    await page.unroute('**/api/staff');
  });
});

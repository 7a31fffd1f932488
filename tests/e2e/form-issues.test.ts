import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { axeViolations, openBrowser, type BrowserSession, signInAt } from '../helpers/browser';

/** The text of everything a field is described by: its hint and, when there is one, its problem. */
async function descriptionOf(page: Page, field: Locator): Promise<string> {
  const ids = ((await field.getAttribute('aria-describedby')) ?? '').split(' ').filter(Boolean);
  const texts = await Promise.all(ids.map((id) => page.locator(`[id="${id}"]`).textContent()));
  return texts.join(' ');
}

describe('a 400 with issues on a form', () => {
  let session: BrowserSession;
  let page: Page;
  beforeAll(async () => {
    session = await openBrowser();
    page = await session.newPage('desktop');
    await signInAt(page, '/console/tanks/new', 'tomas@driftglass.test');
  });
  afterAll(() => session.close());

  it('puts each of the server’s messages under the field it names, and the rest above the button', async () => {
    // The client's own checks pass; the answer stands in for rules only the server can judge.
    await page.route('**/api/tanks', async (route) => {
      if (route.request().method() !== 'POST') return route.fallback();
      await route.fulfill({
        status: 400,
        contentType: 'application/json',
        body: JSON.stringify({
          error: {
            code: 'invalid_request',
            message: 'The request is not valid.',
            issues: [
              { path: 'body.name', message: 'another tank of this company already has this name' },
              { path: 'body.displayVolume', message: 'a tank holds at most 100,000 litres here' },
              { path: 'body.serviceIntervalDays', message: 'at most 365 days' },
              { path: 'body.coverPhotoId', message: 'that photo belongs to another tank' },
            ],
          },
        }),
      });
    });

    await page.getByLabel('Tank name').fill('Harbour office reef');
    await page.getByLabel(/Display tank/).fill('300');
    await page.getByRole('button', { name: 'Create tank' }).click();

    const name = page.getByLabel('Tank name');
    await expect.poll(() => name.getAttribute('aria-invalid')).toBe('true');
    expect(await descriptionOf(page, name)).toContain('another tank of this company already has this name');
    const display = page.getByLabel(/Display tank/);
    expect(await display.getAttribute('aria-invalid')).toBe('true');
    expect(await descriptionOf(page, display)).toContain('a tank holds at most 100,000 litres here');
    const interval = page.getByLabel('Visit every (days)');
    expect(await interval.getAttribute('aria-invalid')).toBe('true');
    expect(await descriptionOf(page, interval)).toContain('at most 365 days');
    // An issue about something the form does not show is said once, for the whole form.
    expect(
      await page.getByRole('alert').filter({ hasText: 'that photo belongs to another tank' }).count(),
    ).toBe(1);
    // The first field with a problem takes the focus, so a keyboard or screen reader starts there.
    expect(await name.evaluate((element) => element === document.activeElement)).toBe(true);
    expect(await axeViolations(page)).toEqual([]);
    expect(page.url()).toMatch(/\/console\/tanks\/new$/);
  });
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { axeViolations, openBrowser, screenshot, type BrowserSession } from '../helpers/browser';

describe('landing page', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(() => session.close());

  for (const viewport of ['phone', 'desktop'] as const) {
    it(`shows the service status and passes axe on a ${viewport}`, async () => {
      const page = await session.newPage(viewport);
      await page.goto('/');
      await expect.poll(() => page.getByTestId('service-status').textContent()).toBe('All systems running');
      expect(await page.getByRole('heading', { level: 1 }).textContent()).toContain('Your tank');
      expect(await page.getByRole('main').getByRole('link', { name: 'Sign in' }).isVisible()).toBe(true);
      expect(await axeViolations(page)).toEqual([]);
      await screenshot(page, `landing-${viewport}`);
    });
  }

  it('shows a not-found page for an unknown address', async () => {
    const page = await session.newPage('phone');
    await page.goto('/no/such/page');
    await page.getByRole('heading', { name: 'Nothing lives at this address' }).waitFor();
    expect(await axeViolations(page)).toEqual([]);
  });
});

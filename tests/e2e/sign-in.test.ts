import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPassword } from '../../api/dev/demo-people';
import { axeViolations, openBrowser, screenshot, type BrowserSession } from '../helpers/browser';

describe('signing in through the identity provider', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(() => session.close());

  it('lets the demo owner sign in, see their own name and tanks, and sign out', async () => {
    const page = await session.newPage('phone');
    await page.goto('/');
    await page.getByRole('link', { name: 'Sign in' }).first().click();

    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'identity-provider-sign-in-phone');
    await page.getByLabel('Email').fill('helen@ashdown-home.test');
    await page.getByLabel('Password').fill('wrong password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText("That email and password don't match.").waitFor();
    await page.getByLabel('Password').fill(demoPassword);
    await page.getByRole('button', { name: 'Sign in' }).click();

    await page.waitForURL(/\/tanks$/);
    await expect.poll(() => page.getByTestId('signed-in-name').textContent()).toBe('Helen Ashdown');
    await page.getByRole('heading', { name: 'Living room reef' }).waitFor();
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'my-tanks-phone');

    // On a phone the way out sits behind the account button, to keep the header one row.
    await page.getByRole('button', { name: 'Account' }).click();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('button', { name: 'Sign out of Brinewatch ID' }).click();
    await page.waitForURL((url) => url.pathname === '/');
    await page.getByRole('link', { name: 'Sign in' }).first().waitFor();
  });

  it('sends a signed-out visitor of a guarded page to sign in and back to it', async () => {
    const page = await session.newPage('desktop');
    await page.goto('/console/clients');
    await page.getByLabel('Email').fill('tomas@driftglass.test');
    await page.getByLabel('Password').fill(demoPassword);
    await page.getByRole('button', { name: 'Sign in' }).click();

    await page.waitForURL(/\/console\/clients$/);
    await expect.poll(() => page.getByTestId('signed-in-name').textContent()).toBe('Tomas Lindqvist');
  });
});

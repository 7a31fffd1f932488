import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { createCompany, createPerson, type TestPerson } from '../helpers/factories';
import { days, hours, minutes } from '../helpers/clock';
import { HttpBrowser, location, readForm } from '../helpers/http-browser';
import { openSignInPage, signIn, startTestStack, submitSignIn, type TestStack } from '../helpers/stack';

describe('sign-in through OpenID Connect', () => {
  let stack: TestStack;
  let owner: TestPerson;

  beforeAll(async () => {
    stack = await startTestStack();
    const company = await createCompany(stack.database.db, { name: 'Reefline Test Co' });
    owner = await createPerson(stack.database.db, {
      companyId: company.id,
      role: 'owner',
      issuer: stack.idp.issuer,
      name: 'Olive Owner',
    });
  });
  afterAll(() => stack.close());
  afterEach(() => stack.clock.reset());

  const me = (browser: HttpBrowser) => browser.visit(`${stack.origin}/api/me`);

  it('signs an invited person in and returns them where they were going', async () => {
    const browser = new HttpBrowser();
    const landing = await signIn(stack, browser, owner, '/tanks?view=list');

    expect(landing).toBe(`${stack.origin}/tanks?view=list`);
    const res = await me(browser);
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({
      name: 'Olive Owner',
      role: 'owner',
      company: { name: 'Reefline Test Co' },
    });
    expect(res.headers.get('cache-control')).toBe('no-store');
  });

  it('answers /api/me with 401 when signed out', async () => {
    const res = await me(new HttpBrowser());
    expect(res.status).toBe(401);
    expect(await res.json()).toMatchObject({ error: { code: 'unauthenticated' } });
  });

  it('sets an HttpOnly, SameSite=Lax session cookie and changes the session id at sign-in', async () => {
    // Starting a sign-in stores no session, so the id to replace is one already in the browser,
    // as a planted (fixated) cookie would be.
    const earlier = new HttpBrowser();
    await signIn(stack, earlier, owner);
    const browser = new HttpBrowser();
    browser.restore(stack.origin, earlier.snapshot(stack.origin));
    const { form } = await openSignInPage(stack, browser);
    const before = browser.cookies(stack.origin).get('bw_session');
    const callback = await submitSignIn(stack, browser, form.action, owner);
    const done = await browser.visit(callback);
    const setCookie = done.headers.getSetCookie().find((line) => line.startsWith('bw_session='));
    const after = browser.cookies(stack.origin).get('bw_session');

    expect(before).toBeTruthy();
    expect(after).toBeTruthy();
    expect(after).not.toBe(before);
    expect(setCookie).toMatch(/HttpOnly/i);
    expect(setCookie).toMatch(/SameSite=Lax/i);
  });

  it('uses PKCE with S256, a state and a nonce', async () => {
    const { authorizationUrl } = await openSignInPage(stack, new HttpBrowser());
    const params = new URL(authorizationUrl).searchParams;

    expect(params.get('code_challenge_method')).toBe('S256');
    expect(params.get('code_challenge')).toMatch(/^[\w-]{43}$/);
    expect(params.get('state')).toBeTruthy();
    expect(params.get('nonce')).toBeTruthy();
    expect(params.get('redirect_uri')).toBe(`${stack.origin}/auth/callback`);
  });

  it('refuses a callback whose state is wrong', async () => {
    const browser = new HttpBrowser();
    const { form } = await openSignInPage(stack, browser);
    const callback = new URL(await submitSignIn(stack, browser, form.action, owner));
    callback.searchParams.set('state', 'forged-state');

    const done = await browser.visit(callback);

    expect(location(done, stack.origin)).toBe(`${stack.origin}/sign-in-problem`);
    expect((await me(browser)).status).toBe(401);
  });

  it('accepts a callback once: replaying it is refused', async () => {
    const browser = new HttpBrowser();
    const { form } = await openSignInPage(stack, browser);
    const callback = await submitSignIn(stack, browser, form.action, owner);
    const stolen = browser.snapshot(stack.origin);
    await browser.visit(callback);

    const attacker = new HttpBrowser();
    attacker.restore(stack.origin, stolen);
    const replay = await attacker.visit(callback);

    expect(location(replay, stack.origin)).toBe(`${stack.origin}/sign-in-problem`);
    expect((await me(attacker)).status).toBe(401);
  });

  for (const [what, change] of [
    ['missing', (url: URL) => url.searchParams.delete('nonce')],
    ['wrong', (url: URL) => url.searchParams.set('nonce', 'not-the-nonce-we-sent')],
  ] as const) {
    it(`refuses an ID token whose nonce is ${what}`, async () => {
      const browser = new HttpBrowser();
      const { authorizationUrl } = await openSignInPage(stack, browser);
      const tampered = new URL(authorizationUrl);
      change(tampered);
      const page = await browser.followWithin(stack.idp.issuer, tampered.href);
      if (typeof page === 'string') throw new Error('expected the sign-in page');
      const form = readForm(await page.text(), page.url || tampered.href);
      const callback = await submitSignIn(stack, browser, form.action, owner);

      const done = await browser.visit(callback);

      expect(location(done, stack.origin)).toBe(`${stack.origin}/sign-in-problem`);
      expect((await me(browser)).status).toBe(401);
    });
  }

  it('refuses an ID token that has expired by the time it arrives', async () => {
    const browser = new HttpBrowser();
    const { form } = await openSignInPage(stack, browser);
    const callback = await submitSignIn(stack, browser, form.action, owner);
    stack.clock.advance(hours(2));

    const done = await browser.visit(callback);

    expect(location(done, stack.origin)).toBe(`${stack.origin}/sign-in-problem`);
    expect((await me(browser)).status).toBe(401);
  });

  for (const returnTo of [
    'https://evil.test/phish',
    '//evil.test/phish',
    '/\\evil.test',
    'javascript:alert(1)',
  ]) {
    it(`does not redirect to ${returnTo} after sign-in`, async () => {
      const landing = await signIn(stack, new HttpBrowser(), owner, returnTo);
      expect(landing).toBe(`${stack.origin}/tanks`);
    });
  }

  it('signs out: the server session ends, the provider is told, and the old cookie gets 401', async () => {
    const browser = new HttpBrowser();
    await signIn(stack, browser, owner);
    const stolen = browser.snapshot(stack.origin);

    const res = await browser.visit(`${stack.origin}/auth/logout`, {
      method: 'POST',
      headers: stack.sameOrigin,
    });
    const { redirectTo } = (await res.json()) as { redirectTo: string };
    const endSession = new URL(redirectTo);

    expect(res.status).toBe(200);
    expect(endSession.origin + endSession.pathname).toBe(`${stack.idp.issuer}/session/end`);
    expect(endSession.searchParams.get('post_logout_redirect_uri')).toBe(`${stack.origin}/`);
    expect(endSession.searchParams.get('id_token_hint')).toBeTruthy();
    const replay = new HttpBrowser();
    replay.restore(stack.origin, stolen);
    expect((await me(replay)).status).toBe(401);
  });

  it('ends a session that was idle longer than the idle timeout', async () => {
    const browser = new HttpBrowser();
    await signIn(stack, browser, owner);
    stack.clock.advance(hours(7));
    expect((await me(browser)).status).toBe(200);
    stack.clock.advance(hours(7));
    expect((await me(browser)).status).toBe(200);
    stack.clock.advance(hours(8) + minutes(1));
    expect((await me(browser)).status).toBe(401);
  });

  it('ends a session at its absolute lifetime even when it is used all the time', async () => {
    const browser = new HttpBrowser();
    await signIn(stack, browser, owner);
    for (let elapsed = 0; elapsed < days(7); elapsed += hours(6)) {
      expect((await me(browser)).status).toBe(200);
      stack.clock.advance(hours(6));
    }
    stack.clock.advance(minutes(1));
    expect((await me(browser)).status).toBe(401);
  });

  it('shows "no access yet" to someone who signs in without an invitation', async () => {
    const stranger: TestPerson = {
      ...owner,
      sub: 'sub-stranger',
      email: 'stranger@example.test',
      name: 'Sam Stranger',
      id: '',
    };
    stack.idp.addAccount({
      sub: stranger.sub,
      email: stranger.email,
      name: stranger.name,
      password: stranger.password,
    });
    const browser = new HttpBrowser();
    const { form } = await openSignInPage(stack, browser);
    const callback = await submitSignIn(stack, browser, form.action, stranger);

    const done = await browser.visit(callback);
    const access = await browser.visit(`${stack.origin}/api/me/access`);

    expect(location(done, stack.origin)).toBe(`${stack.origin}/no-access`);
    expect((await me(browser)).status).toBe(401);
    expect(await access.json()).toMatchObject({
      signedIn: false,
      noAccess: { email: 'stranger@example.test', reason: 'not-invited' },
    });
  });
});

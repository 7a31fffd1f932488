import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { createCompany, createPerson, type TestPerson } from '../helpers/factories';
import { HttpBrowser, location } from '../helpers/http-browser';
import { openSignInPage, startTestStack, submitSignIn, type TestStack } from '../helpers/stack';

/** OpenID Connect Core 1.0 §3.1.3.7: the checks the relying party makes on every ID token. */
describe('ID token validation at /auth/callback', () => {
  let stack: TestStack;
  let owner: TestPerson;

  beforeAll(async () => {
    stack = await startTestStack({ forgingProxy: true });
    const company = await createCompany(stack.database.db);
    owner = await createPerson(stack.database.db, {
      companyId: company.id,
      role: 'owner',
      issuer: stack.idp.issuer,
    });
    stack.idp.addAccount({ sub: owner.sub, email: owner.email, name: owner.name, password: owner.password });
  });
  afterAll(() => stack.close());
  afterEach(() => stack.clock.reset());

  async function callbackWith(forge?: () => void) {
    const browser = new HttpBrowser();
    const { form } = await openSignInPage(stack, browser);
    const callback = await submitSignIn(stack, browser, form.action, owner);
    forge?.();
    const done = await browser.visit(callback);
    const me = await browser.visit(`${stack.origin}/api/me`);
    return { landing: location(done, stack.origin), me: me.status };
  }

  it('accepts an untouched ID token (the proxy itself changes nothing)', async () => {
    expect(await callbackWith()).toEqual({ landing: `${stack.origin}/tanks`, me: 200 });
  });

  const refused = { landing: expect.stringMatching(/\/sign-in-problem$/), me: 401 };

  it('refuses an ID token from another issuer, even with a valid signature', async () => {
    const result = await callbackWith(() =>
      stack.forge((claims) => ({ ...claims, iss: 'http://127.0.0.1:1' })),
    );
    expect(result).toEqual(refused);
  });

  it('refuses an ID token meant for another client (aud)', async () => {
    const result = await callbackWith(() => stack.forge((claims) => ({ ...claims, aud: 'some-other-app' })));
    expect(result).toEqual(refused);
  });

  it('refuses an expired ID token', async () => {
    const past = Math.floor(Date.now() / 1000) - 3600;
    const result = await callbackWith(() =>
      stack.forge((claims) => ({ ...claims, iat: past - 3600, exp: past })),
    );
    expect(result).toEqual(refused);
  });

  it('refuses an ID token whose nonce was swapped', async () => {
    const result = await callbackWith(() => stack.forge((claims) => ({ ...claims, nonce: 'swapped' })));
    expect(result).toEqual(refused);
  });

  it('refuses an ID token signed by a key the provider does not publish', async () => {
    const result = await callbackWith(() => stack.forge((claims) => claims, 'stranger'));
    expect(result).toEqual(refused);
  });
});

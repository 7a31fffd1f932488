import * as oidc from 'openid-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  identityProviderCookieNames,
  startIdentityProvider,
  type IdpAccount,
  type RunningIdentityProvider,
} from '../../../api/dev/identity-provider';
import { HttpBrowser, location, readForm } from '../../helpers/http-browser';

const appOrigin = 'http://localhost:4999';
const relyingParty = {
  clientId: 'brinewatch-test',
  clientSecret: 'test-only-secret-6c1f0e',
  redirectUris: [`${appOrigin}/auth/callback`],
  postLogoutRedirectUris: [`${appOrigin}/signed-out`],
};
const ines: IdpAccount = {
  sub: 'u-test-ines',
  email: 'ines@reefside-test.test',
  name: 'Ines Carvalho',
  password: 'coral-lantern-42',
};

describe('Brinewatch ID stand-in', () => {
  let idp: RunningIdentityProvider;
  let client: oidc.Configuration;

  beforeAll(async () => {
    idp = await startIdentityProvider({ port: 0, accounts: [ines], clients: [relyingParty] });
    client = await oidc.discovery(
      new URL(idp.issuer),
      relyingParty.clientId,
      undefined,
      oidc.ClientSecretBasic(relyingParty.clientSecret),
      { execute: [oidc.allowInsecureRequests] },
    );
  });

  afterAll(async () => {
    await idp.close();
  });

  async function startSignIn(jar: HttpBrowser, extra: Record<string, string> = {}) {
    const codeVerifier = oidc.randomPKCECodeVerifier();
    const state = oidc.randomState();
    const authorizationUrl = oidc.buildAuthorizationUrl(client, {
      redirect_uri: relyingParty.redirectUris[0] ?? '',
      scope: 'openid email profile',
      code_challenge: await oidc.calculatePKCECodeChallenge(codeVerifier),
      code_challenge_method: 'S256',
      state,
      ...extra,
    });
    const toInteraction = await jar.visit(authorizationUrl);
    expect(toInteraction.status).toBe(303);
    const interactionUrl = location(toInteraction, idp.issuer);
    const page = await jar.visit(interactionUrl);
    return { codeVerifier, state, interactionUrl, page, html: await page.text() };
  }

  /** Signs in and returns the tokens the app would hold afterwards. */
  async function signIn(jar: HttpBrowser, account: Pick<IdpAccount, 'email' | 'password'>) {
    const { codeVerifier, state, interactionUrl, html } = await startSignIn(jar);
    const { action } = readForm(html, interactionUrl);
    const afterLogin = await jar.postForm(action, { email: account.email, password: account.password });
    expect(afterLogin.status).toBe(303);
    const callback = await jar.followWithin(idp.issuer, location(afterLogin, action));
    if (typeof callback !== 'string')
      throw new Error(`stopped at ${callback.status}: ${await callback.text()}`);
    return oidc.authorizationCodeGrant(client, new URL(callback), {
      pkceCodeVerifier: codeVerifier,
      expectedState: state,
    });
  }

  it('publishes a discovery document naming its issuer', async () => {
    const response = await fetch(`${idp.issuer}/.well-known/openid-configuration`);
    const discovery = (await response.json()) as Record<string, unknown>;

    expect(idp.issuer).toBe(`http://127.0.0.1:${idp.port}`);
    expect(discovery).toMatchObject({
      issuer: idp.issuer,
      response_types_supported: ['code'],
      code_challenge_methods_supported: ['S256'],
      end_session_endpoint: `${idp.issuer}/session/end`,
    });
    expect(discovery.claims_supported).toEqual(
      expect.arrayContaining(['sub', 'email', 'email_verified', 'name']),
    );
    expect(discovery.scopes_supported).toEqual(expect.arrayContaining(['openid', 'email', 'profile']));
  });

  it('serves an accessible Brinewatch ID sign-in page', async () => {
    const { page, html } = await startSignIn(new HttpBrowser());

    expect(page.status).toBe(200);
    expect(page.headers.get('content-security-policy')).toContain("frame-ancestors 'none'");
    expect(html).toContain('<html lang="en">');
    expect(html).toContain('<main>');
    expect(html).toContain('Brinewatch ID');
    expect(html).toMatch(/<label for="email">Email<\/label>\s*<input id="email" name="email" type="email"/);
    expect(html).toMatch(
      /<label for="password">Password<\/label>\s*<input id="password" name="password" type="password"/,
    );
    expect(html).toContain('<button type="submit">Sign in</button>');
    expect(html).not.toMatch(/<(script|link)\b/);
  });

  it('signs a person in with the authorization code flow and PKCE, and names them in the ID token', async () => {
    const jar = new HttpBrowser();
    const { codeVerifier, state, interactionUrl, html } = await startSignIn(jar);
    const { action } = readForm(html, interactionUrl);

    const wrong = await jar.postForm(action, { email: ines.email, password: 'not-the-password' });
    const wrongHtml = await wrong.text();
    expect(wrong.status).toBe(401);
    expect(wrongHtml).toContain("That email and password don't match.");
    expect(wrongHtml).toContain(`value="${ines.email}"`);

    const right = await jar.postForm(action, { email: ines.email, password: ines.password });
    expect(right.status).toBe(303);
    const callback = await jar.followWithin(idp.issuer, location(right, action));
    if (typeof callback !== 'string') throw new Error(`stopped at ${callback.status}`);
    const callbackUrl = new URL(callback);
    expect(callbackUrl.origin + callbackUrl.pathname).toBe(relyingParty.redirectUris[0]);
    expect(callbackUrl.searchParams.get('code')).toBeTruthy();

    const tokens = await oidc.authorizationCodeGrant(client, callbackUrl, {
      pkceCodeVerifier: codeVerifier,
      expectedState: state,
    });
    expect(tokens.claims()).toMatchObject({
      iss: idp.issuer,
      aud: relyingParty.clientId,
      sub: ines.sub,
      email: ines.email,
      email_verified: true,
      name: ines.name,
    });
    const userinfo = await oidc.fetchUserInfo(client, tokens.access_token, ines.sub);
    expect(userinfo).toMatchObject({ sub: ines.sub, email: ines.email, name: ines.name });
  });

  it('gives its cookies names of its own, apart from the app', async () => {
    const jar = new HttpBrowser();
    await signIn(jar, ines);

    expect([...jar.seenCookieNames].filter((name) => !name.endsWith('.sig')).sort()).toEqual(
      Object.values(identityProviderCookieNames).sort(),
    );
  });

  it('answers an unknown email exactly like a wrong password', async () => {
    const jar = new HttpBrowser();
    const { interactionUrl, html } = await startSignIn(jar);
    const { action } = readForm(html, interactionUrl);

    const response = await jar.postForm(action, {
      email: 'nobody@reefside-test.test',
      password: ines.password,
    });

    expect(response.status).toBe(401);
    expect(await response.text()).toContain("That email and password don't match.");
  });

  it('keeps the typed email escaped when it shows it again', async () => {
    const jar = new HttpBrowser();
    const { interactionUrl, html } = await startSignIn(jar);
    const { action } = readForm(html, interactionUrl);

    const response = await jar.postForm(action, { email: '"><script>alert(1)</script>', password: 'x' });
    const page = await response.text();

    expect(page).not.toContain('<script>');
    expect(page).toContain('value="&quot;&gt;&lt;script&gt;alert(1)&lt;/script&gt;"');
  });

  it('refuses an authorization request without a PKCE challenge', async () => {
    const url = oidc.buildAuthorizationUrl(client, {
      redirect_uri: relyingParty.redirectUris[0] ?? '',
      scope: 'openid email profile',
      state: 'no-pkce',
    });

    const response = await new HttpBrowser().visit(url);
    const redirect = new URL(location(response, idp.issuer));

    expect(redirect.searchParams.get('error')).toBe('invalid_request');
    expect(redirect.searchParams.get('error_description')).toMatch(/PKCE/);
  });

  it('signs in an account added after it started', async () => {
    const ruth: IdpAccount = {
      sub: 'u-test-ruth',
      email: 'ruth@reefside-test.test',
      name: 'Ruth Abernethy',
      password: 'kelp-forest-9',
      emailVerified: false,
    };
    idp.addAccount(ruth);

    const tokens = await signIn(new HttpBrowser(), ruth);

    expect(tokens.claims()).toMatchObject({ sub: ruth.sub, email: ruth.email, email_verified: false });
  });

  it('sends the browser back to the registered address after signing out', async () => {
    const jar = new HttpBrowser();
    const tokens = await signIn(jar, ines);
    const endSessionUrl = oidc.buildEndSessionUrl(client, {
      id_token_hint: tokens.id_token ?? '',
      post_logout_redirect_uri: relyingParty.postLogoutRedirectUris[0] ?? '',
      state: 'bye',
    });

    const confirmPage = await jar.visit(endSessionUrl);
    const html = await confirmPage.text();
    expect(confirmPage.status).toBe(200);
    expect(html).toContain('Sign out of Brinewatch ID');
    const { action, fields } = readForm(html, endSessionUrl.href);
    expect(fields.get('logout')).toBe('yes');
    const signedOut = await jar.postForm(action, fields);

    expect(signedOut.status).toBe(303);
    expect(signedOut.headers.get('location')).toBe(`${relyingParty.postLogoutRedirectUris[0]}?state=bye`);
    const next = await startSignIn(jar);
    expect(next.html).toContain('<h1>Sign in</h1>');
  });

  it('refuses a post-logout address that was not registered', async () => {
    const jar = new HttpBrowser();
    const tokens = await signIn(jar, ines);
    const url = oidc.buildEndSessionUrl(client, {
      id_token_hint: tokens.id_token ?? '',
      post_logout_redirect_uri: 'http://localhost:4999/elsewhere',
    });

    const response = await jar.visit(url);

    expect(response.status).toBe(400);
    expect(await response.text()).toContain('post_logout_redirect_uri not registered');
  });

  it('shows an expiry page for a sign-in link it no longer knows', async () => {
    const response = await new HttpBrowser().visit(`${idp.issuer}/interaction/long-gone`);

    expect(response.status).toBe(400);
    expect(await response.text()).toContain('This sign-in page has expired');
  });
});

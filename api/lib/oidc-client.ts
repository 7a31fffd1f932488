import * as oidc from 'openid-client';
import type { Clock } from './clock';

export interface OidcSettings {
  issuer: string;
  clientId: string;
  clientSecret: string;
  redirectUri: string;
  postLogoutRedirectUri: string;
  clock: Clock;
}

export interface PendingLogin {
  state: string;
  nonce: string;
  codeVerifier: string;
  returnTo: string;
}

export interface VerifiedIdentity {
  issuer: string;
  subject: string;
  email: string | null;
  name: string | null;
  idToken: string;
}

export class SignInRefused extends Error {
  constructor(readonly reason: string) {
    super(reason);
    this.name = 'SignInRefused';
  }
}

/**
 * The relying party (openid-client 6): discovery pinned to the configured issuer, the
 * authorization-code flow with PKCE (S256), state and nonce, ID token validation (iss, aud,
 * exp, nonce, signature) by the library. Tokens never leave the server.
 */
export function createOidcClient(settings: OidcSettings) {
  let configuration: Promise<oidc.Configuration> | undefined;
  let configuredSkew = 0;

  function config(): Promise<oidc.Configuration> {
    // The RP's idea of "now" follows the app's clock (always the system clock outside tests),
    // so ID-token expiry can be tested; a changed skew means a fresh configuration.
    const skew = Math.round((settings.clock().getTime() - Date.now()) / 1000);
    if (skew !== configuredSkew) configuration = undefined;
    configuredSkew = skew;
    configuration ??= oidc
      .discovery(
        new URL(settings.issuer),
        settings.clientId,
        { client_secret: settings.clientSecret, [oidc.clockSkew]: skew },
        oidc.ClientSecretBasic(settings.clientSecret),
        { execute: settings.issuer.startsWith('http://') ? [oidc.allowInsecureRequests] : [] },
      )
      .then((c) => {
        // OIDC Core lets a client skip the signature check on a token-endpoint ID token; we check it anyway.
        oidc.enableNonRepudiationChecks(c);
        return c;
      })
      .catch((error: unknown) => {
        configuration = undefined;
        throw error;
      });
    return configuration;
  }

  return {
    async startLogin(returnTo: string): Promise<{ url: string; pending: PendingLogin }> {
      const c = await config();
      const pending: PendingLogin = {
        state: oidc.randomState(),
        nonce: oidc.randomNonce(),
        codeVerifier: oidc.randomPKCECodeVerifier(),
        returnTo,
      };
      const url = oidc.buildAuthorizationUrl(c, {
        redirect_uri: settings.redirectUri,
        scope: 'openid email profile',
        response_type: 'code',
        code_challenge: await oidc.calculatePKCECodeChallenge(pending.codeVerifier),
        code_challenge_method: 'S256',
        state: pending.state,
        nonce: pending.nonce,
      });
      return { url: url.href, pending };
    },

    async finishLogin(callbackUrl: URL, pending: PendingLogin): Promise<VerifiedIdentity> {
      const c = await config();
      let tokens: Awaited<ReturnType<typeof oidc.authorizationCodeGrant>>;
      try {
        tokens = await oidc.authorizationCodeGrant(c, callbackUrl, {
          pkceCodeVerifier: pending.codeVerifier,
          expectedState: pending.state,
          expectedNonce: pending.nonce,
          idTokenExpected: true,
        });
      } catch (error) {
        throw new SignInRefused(error instanceof Error ? error.message : 'the provider refused the sign-in');
      }
      const claims = tokens.claims();
      if (!claims || !tokens.id_token) throw new SignInRefused('no ID token');
      let email = typeof claims.email === 'string' ? claims.email : null;
      let name = typeof claims.name === 'string' ? claims.name : null;
      if ((!email || !name) && tokens.access_token) {
        const info = await oidc.fetchUserInfo(c, tokens.access_token, claims.sub);
        email ??= info.email ?? null;
        name ??= info.name ?? null;
      }
      return { issuer: claims.iss, subject: claims.sub, email, name, idToken: tokens.id_token };
    },

    async endSessionUrl(idToken: string | undefined): Promise<string> {
      const c = await config();
      return oidc.buildEndSessionUrl(c, {
        post_logout_redirect_uri: settings.postLogoutRedirectUri,
        client_id: settings.clientId,
        ...(idToken ? { id_token_hint: idToken } : {}),
      }).href;
    },
  };
}

export type OidcClient = ReturnType<typeof createOidcClient>;

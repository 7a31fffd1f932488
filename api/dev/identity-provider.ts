import { createHash, generateKeyPair, randomBytes, timingSafeEqual } from 'node:crypto';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { promisify } from 'node:util';
import express, { type NextFunction, type Request, type Response } from 'express';
import Provider, {
  errors,
  type Account,
  type Configuration,
  type Interaction,
  type JWKS,
  type KoaContextWithOIDC,
} from 'oidc-provider';
import {
  errorPage,
  expiredInteractionPage,
  pageSecurityHeaders,
  signedOutPage,
  signInPage,
  signOutPage,
} from './identity-provider-views';

/**
 * Brinewatch ID stand-in: a real OpenID provider (oidc-provider) on loopback with its own
 * sign-in page, so the app runs the same authorization-code + PKCE flow it runs against the
 * hosted service. Everything is in memory and lasts as long as the process.
 */

export interface IdpAccount {
  sub: string;
  email: string;
  name: string;
  password: string;
  emailVerified?: boolean;
}

export interface IdpClient {
  clientId: string;
  clientSecret: string;
  redirectUris: string[];
  postLogoutRedirectUris: string[];
  /** Defaults to client_secret_basic. openid-client sends client_secret_post unless told otherwise. */
  tokenEndpointAuthMethod?: 'client_secret_basic' | 'client_secret_post';
}

export interface IdentityProviderOptions {
  host?: string;
  /** 0 picks a free port. */
  port: number;
  accounts: IdpAccount[];
  clients: IdpClient[];
  /** Keys signing the provider's cookies; random per start when omitted. */
  cookieKeys?: string[];
  /** When it sits behind a proxy (tests that tamper with responses): the issuer clients see. */
  issuer?: string;
  /** Private JWKS signing ID tokens; one RSA key per process when omitted. Tests that forge tokens pass their own. */
  signingKeys?: JWKS;
}

export interface RunningIdentityProvider {
  issuer: string;
  port: number;
  addAccount(account: IdpAccount): void;
  close(): Promise<void>;
}

/**
 * The app and the provider share a cookie jar when both run on one host name (cookies ignore
 * the port), so the provider's cookies carry names of their own.
 */
export const identityProviderCookieNames = {
  session: 'bwid_session',
  interaction: 'bwid_interaction',
  resume: 'bwid_interaction_resume',
} as const;

const oneHour = 60 * 60;
const oneDay = 24 * oneHour;

interface StoredAccount {
  sub: string;
  email: string;
  name: string;
  emailVerified: boolean;
  passwordHash: Buffer;
}

const hashPassword = (password: string) => createHash('sha256').update(password, 'utf8').digest();
const normaliseEmail = (email: string) => email.trim().toLowerCase();

class AccountBook {
  readonly #bySub = new Map<string, StoredAccount>();
  readonly #subByEmail = new Map<string, string>();
  // Compared against when no account has the email, so a miss costs the same as a wrong password.
  readonly #decoyHash = hashPassword(randomBytes(16).toString('hex'));

  add(account: IdpAccount): void {
    const email = normaliseEmail(account.email);
    const holder = this.#subByEmail.get(email);
    if (holder !== undefined && holder !== account.sub) {
      throw new Error(`Brinewatch ID stand-in: ${account.email} already belongs to account ${holder}.`);
    }
    const previous = this.#bySub.get(account.sub);
    if (previous) this.#subByEmail.delete(normaliseEmail(previous.email));
    this.#bySub.set(account.sub, {
      sub: account.sub,
      email: account.email,
      name: account.name,
      emailVerified: account.emailVerified ?? true,
      passwordHash: hashPassword(account.password),
    });
    this.#subByEmail.set(email, account.sub);
  }

  get(sub: string): StoredAccount | undefined {
    return this.#bySub.get(sub);
  }

  verify(email: string, password: string): StoredAccount | null {
    const sub = this.#subByEmail.get(normaliseEmail(email));
    const account = sub === undefined ? undefined : this.#bySub.get(sub);
    const matches = timingSafeEqual(hashPassword(password), account?.passwordHash ?? this.#decoyHash);
    return matches && account ? account : null;
  }
}

let signingKeys: Promise<JWKS> | undefined;

/**
 * One RSA key per process: tokens only need to outlive the in-memory sessions that issued them.
 * Made off the main thread, which `npm start` spends loading the app meanwhile.
 */
function devSigningKeys(): Promise<JWKS> {
  signingKeys ??= promisify(generateKeyPair)('rsa', { modulusLength: 2048 }).then(({ privateKey }) => ({
    keys: [{ ...privateKey.export({ format: 'jwk' }), use: 'sig', alg: 'RS256' }],
  }));
  return signingKeys;
}

function listen(server: Server, port: number, host: string): Promise<void> {
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
}

function sendPage(res: Response, status: number, html: string): void {
  res.status(status).set(pageSecurityHeaders).type('html').send(html);
}

function setPageHeaders(ctx: KoaContextWithOIDC): void {
  for (const [name, value] of Object.entries(pageSecurityHeaders)) ctx.set(name, value);
}

export async function startIdentityProvider(
  options: IdentityProviderOptions,
): Promise<RunningIdentityProvider> {
  const host = options.host ?? '127.0.0.1';
  const accounts = new AccountBook();
  for (const account of options.accounts) accounts.add(account);

  const app = express();
  app.disable('x-powered-by');
  const server = createServer(app);
  // The issuer names the real port, so listen first and build the provider after.
  await listen(server, options.port, host);
  const port = (server.address() as AddressInfo).port;
  const issuer = options.issuer ?? `http://${host.includes(':') ? `[${host}]` : host}:${port}`;

  const findAccount = (_ctx: KoaContextWithOIDC, sub: string): Account | undefined => {
    const account = accounts.get(sub);
    if (!account) return undefined;
    return {
      accountId: account.sub,
      claims: () => ({
        sub: account.sub,
        email: account.email,
        email_verified: account.emailVerified,
        name: account.name,
      }),
    };
  };

  const configuration: Configuration = {
    clients: options.clients.map((client) => ({
      client_id: client.clientId,
      client_secret: client.clientSecret,
      redirect_uris: client.redirectUris,
      post_logout_redirect_uris: client.postLogoutRedirectUris,
      grant_types: ['authorization_code'],
      response_types: ['code'],
      token_endpoint_auth_method: client.tokenEndpointAuthMethod ?? 'client_secret_basic',
    })),
    findAccount,
    jwks: options.signingKeys ?? (await devSigningKeys()),
    claims: { openid: ['sub'], email: ['email', 'email_verified'], profile: ['name'] },
    // No refresh tokens here, so offline_access is not offered.
    scopes: ['openid'],
    responseTypes: ['code'],
    // The granted email and profile claims also go into the ID token (not only userinfo), so the
    // app learns who signed in from the token response alone, as it does with the hosted service.
    conformIdTokenClaims: false,
    // Only S256 exists in oidc-provider 9; this makes a code_challenge mandatory for every client.
    pkce: { required: () => true },
    cookies: {
      names: identityProviderCookieNames,
      keys: options.cookieKeys ?? [randomBytes(32).toString('base64url')],
      long: { httpOnly: true, sameSite: 'lax' },
      short: { httpOnly: true, sameSite: 'lax' },
    },
    ttl: {
      AccessToken: oneHour,
      AuthorizationCode: 60,
      IdToken: oneHour,
      Interaction: oneHour,
      Session: oneDay,
      Grant: oneDay,
    },
    features: {
      devInteractions: { enabled: false },
      userinfo: { enabled: true },
      rpInitiatedLogout: {
        enabled: true,
        logoutSource(ctx: KoaContextWithOIDC, form: string) {
          setPageHeaders(ctx);
          ctx.type = 'html';
          ctx.body = signOutPage(form);
        },
        postLogoutSuccessSource(ctx: KoaContextWithOIDC) {
          const client = ctx.oidc.client;
          const target = client?.postLogoutRedirectUris?.[0] ?? client?.redirectUris?.[0];
          setPageHeaders(ctx);
          ctx.type = 'html';
          ctx.body = signedOutPage({ backTo: target ? new URL(target).origin : null });
        },
      },
    },
    // The app calls the provider from its server; no browser origin needs CORS.
    clientBasedCORS: () => false,
    renderError(ctx, out) {
      setPageHeaders(ctx);
      ctx.type = 'html';
      ctx.body = errorPage({ code: out.error, description: out.error_description ?? null });
    },
  };

  let provider: Provider;
  try {
    provider = new Provider(issuer, configuration);
  } catch (error) {
    server.close();
    throw error;
  }
  provider.on('server_error', (_ctx, error) => {
    console.error('Brinewatch ID stand-in: server error', error);
  });

  /** The interaction behind the cookie, or null when it expired or belongs to another URL. */
  async function currentInteraction(req: Request, res: Response): Promise<Interaction | null> {
    try {
      const interaction = await provider.interactionDetails(req, res);
      return interaction.uid === req.params.uid ? interaction : null;
    } catch (error) {
      if (error instanceof errors.SessionNotFound) return null;
      throw error;
    }
  }

  const signInAction = (uid: string) => `/interaction/${encodeURIComponent(uid)}/login`;

  // First-party clients only: the requested scopes are granted without asking.
  async function grantConsent(req: IncomingMessage, res: ServerResponse, interaction: Interaction) {
    const accountId = interaction.session?.accountId;
    const clientId = interaction.params.client_id;
    if (!accountId || typeof clientId !== 'string') {
      await provider.interactionFinished(req, res, {
        error: 'access_denied',
        error_description: 'no signed-in account to grant access for',
      });
      return;
    }
    const existing = interaction.grantId ? await provider.Grant.find(interaction.grantId) : undefined;
    const grant = existing ?? new provider.Grant({ accountId, clientId });
    const { missingOIDCScope, missingOIDCClaims, missingResourceScopes } = interaction.prompt.details as {
      missingOIDCScope?: string[];
      missingOIDCClaims?: string[];
      missingResourceScopes?: Record<string, string[]>;
    };
    if (missingOIDCScope) grant.addOIDCScope(missingOIDCScope.join(' '));
    if (missingOIDCClaims) grant.addOIDCClaims(missingOIDCClaims);
    for (const [resource, scopes] of Object.entries(missingResourceScopes ?? {})) {
      grant.addResourceScope(resource, scopes.join(' '));
    }
    const grantId = await grant.save();
    await provider.interactionFinished(req, res, { consent: { grantId } }, { mergeWithLastSubmission: true });
  }

  app.get('/interaction/:uid', async (req: Request<{ uid: string }>, res) => {
    const interaction = await currentInteraction(req, res);
    if (!interaction) return sendPage(res, 400, expiredInteractionPage());
    switch (interaction.prompt.name) {
      case 'login': {
        const hint = interaction.params.login_hint;
        const email = typeof hint === 'string' ? hint : '';
        return sendPage(
          res,
          200,
          signInPage({ action: signInAction(interaction.uid), email, failed: false }),
        );
      }
      case 'consent':
        return grantConsent(req, res, interaction);
      default:
        return provider.interactionFinished(req, res, {
          error: 'invalid_request',
          error_description: `unsupported prompt ${interaction.prompt.name}`,
        });
    }
  });

  app.post(
    '/interaction/:uid/login',
    express.urlencoded({ extended: false, limit: '16kb' }),
    async (req: Request<{ uid: string }>, res) => {
      const interaction = await currentInteraction(req, res);
      if (!interaction) return sendPage(res, 400, expiredInteractionPage());
      if (interaction.prompt.name !== 'login') {
        return res.redirect(303, `/interaction/${encodeURIComponent(interaction.uid)}`);
      }
      const body: Record<string, unknown> = req.body ?? {};
      const email = typeof body.email === 'string' ? body.email.trim() : '';
      const password = typeof body.password === 'string' ? body.password : '';
      const account = accounts.verify(email, password);
      if (!account) {
        return sendPage(res, 401, signInPage({ action: signInAction(interaction.uid), email, failed: true }));
      }
      return provider.interactionFinished(
        req,
        res,
        { login: { accountId: account.sub } },
        { mergeWithLastSubmission: false },
      );
    },
  );

  app.use(provider.callback());

  app.use((error: unknown, _req: Request, res: Response, next: NextFunction) => {
    if (res.headersSent) return next(error);
    console.error('Brinewatch ID stand-in: interaction failed', error);
    sendPage(res, 500, errorPage({ code: 'server_error', description: null }));
  });

  return {
    issuer,
    port,
    addAccount: (account) => accounts.add(account),
    close: () =>
      new Promise<void>((resolve, reject) => {
        server.close((error) => (error ? reject(error) : resolve()));
        server.closeAllConnections();
      }),
  };
}

import type { AddressInfo } from 'node:net';
import { once } from 'node:events';
import { createServer } from 'node:http';
import { generateKeyPairSync } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import webpush from 'web-push';
import os from 'node:os';
import path from 'node:path';
import { createApp } from '../../api/app';
import { createDeps, type AppDeps } from '../../api/deps';
import { startIdentityProvider, type RunningIdentityProvider } from '../../api/dev/identity-provider';
import { startMailServer, type RunningMailServer } from '../../api/dev/mail-server';
import { startObjectStorage } from '../../api/dev/object-storage';
import { startPaymentProvider, type RunningPaymentProvider } from '../../api/dev/payment-provider';
import { startPushService, type RunningPushService } from '../../api/dev/push-service';
import { listenForEvents } from '../../api/lib/event-bus';
import { startJobQueue } from '../../api/lib/job-queue';
import { startWorkers } from '../../api/services/workers';
import { parseEnv } from '../../api/env';
import { createLogger, type Logger } from '../../api/lib/logger';
import { testSecrets } from './app';
import { createTestClock, type TestClock } from './clock';
import { createTestDatabase, type TestDatabase } from './db';
import { freePort } from './free-port';
import type { TestPerson } from './factories';
import { type HttpBrowser, location, readForm } from './http-browser';
import { startTokenForgingProxy, type IdTokenTamper } from './token-forging-proxy';

export const testClient = { clientId: 'brinewatch-web', clientSecret: 'test-client-secret-3f9a1c7e' };

/** The payment provider's test-mode keys the stacks give the app and the payment stand-in. */
export const testPaymentKeys = {
  STRIPE_SECRET_KEY: 'sk_test_brinewatchStack4b7e19c2a05d',
  STRIPE_WEBHOOK_SECRET: 'whsec_brinewatchStack9d2f6a81c3e7',
};

export interface TestStack {
  origin: string;
  app: ReturnType<typeof createApp>;
  deps: AppDeps;
  database: TestDatabase;
  idp: RunningIdentityProvider;
  mail: RunningMailServer;
  /** The payment stand-in (STRIPE_API_URL), posting its webhook events to the app on the stack's clock. */
  payments: RunningPaymentProvider;
  /** The local push service, with `background`. */
  push: RunningPushService | null;
  clock: TestClock;
  /** Headers a request from the app's own pages carries on a state change. */
  sameOrigin: Record<string, string>;
  /** With `forgingProxy`: the next ID token is re-signed with changed claims. */
  forge: (tamper: IdTokenTamper, key?: 'provider' | 'stranger') => void;
  close(): Promise<void>;
}

/**
 * The app listening on a free port with its real neighbours: a fresh database, the identity
 * provider stand-in and the SMTP stand-in. Nothing is mocked.
 */
export async function startTestStack(
  options: {
    forgingProxy?: boolean;
    env?: Record<string, string>;
    /** Run the job queue, its workers, web push (to the local push service) and live events. */
    background?: boolean;
    /** Where the app logs; silent unless given. */
    logger?: Logger;
    /** A database to use instead of a copy of the run's template (benches have no global setup). */
    database?: TestDatabase;
  } = {},
) {
  const database = options.database ?? (await createTestDatabase());
  // The app's port is held from the start: its address is needed (APP_ORIGIN) long before the app
  // exists, and a port only looked up could be taken meanwhile by another test file's server.
  const server = createServer();
  server.listen(0, '127.0.0.1');
  await once(server, 'listening');
  const port = (server.address() as AddressInfo).port;
  const origin = `http://localhost:${port}`;
  const mail = await startMailServer({ smtpPort: 0 });
  const storageDir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-s3-'));
  const storage = await startObjectStorage({
    port: await freePort(),
    dir: storageDir,
    bucket: 'test-photos',
  });
  const clock = createTestClock();
  const payments = await startPaymentProvider({
    port: 0,
    secretKey: testPaymentKeys.STRIPE_SECRET_KEY,
    webhookSecret: testPaymentKeys.STRIPE_WEBHOOK_SECRET,
    webhookUrl: `${origin}/api/payments/webhook`,
    clock: clock.now,
    retryDelaysMs: [200, 500, 1000],
  });
  const clients = [
    { ...testClient, redirectUris: [`${origin}/auth/callback`], postLogoutRedirectUris: [`${origin}/`] },
  ];
  let proxy: Awaited<ReturnType<typeof startTokenForgingProxy>> | null = null;
  let idp: RunningIdentityProvider;
  if (options.forgingProxy) {
    const { privateKey } = generateKeyPairSync('rsa', { modulusLength: 2048 });
    const signingJwk = { ...privateKey.export({ format: 'jwk' }), use: 'sig', alg: 'RS256' };
    const proxyPort = await freePort();
    const issuer = `http://127.0.0.1:${proxyPort}`;
    idp = await startIdentityProvider({
      port: 0,
      accounts: [],
      clients,
      issuer,
      signingKeys: { keys: [signingJwk] },
    });
    proxy = await startTokenForgingProxy({
      upstream: `http://127.0.0.1:${idp.port}`,
      port: proxyPort,
      signingJwk,
    });
  } else {
    idp = await startIdentityProvider({ port: 0, accounts: [], clients });
  }
  let push: RunningPushService | null = null;
  const extraEnv: Record<string, string> = {};
  if (options.background) {
    push = await startPushService({ port: 0, dir: storageDir });
    const keys = webpush.generateVAPIDKeys();
    const caFile = path.join(storageDir, 'push-ca.pem');
    writeFileSync(caFile, push.caCertPem);
    Object.assign(extraEnv, {
      VAPID_PUBLIC_KEY: keys.publicKey,
      VAPID_PRIVATE_KEY: keys.privateKey,
      PUSH_TRUSTED_CA_FILE: caFile,
    });
  }
  const env = parseEnv({
    NODE_ENV: 'test',
    LOG_LEVEL: 'silent',
    PORT: String(port),
    APP_ORIGIN: origin,
    DATABASE_URL: database.url,
    OIDC_ISSUER: idp.issuer,
    OIDC_CLIENT_ID: testClient.clientId,
    OIDC_CLIENT_SECRET: testClient.clientSecret,
    SESSION_SECRET: testSecrets.SESSION_SECRET,
    SMTP_PORT: String(mail.smtpPort),
    S3_ENDPOINT: storage.endpoint,
    S3_BUCKET: storage.bucket,
    ...testPaymentKeys,
    STRIPE_API_URL: payments.url,
    ...extraEnv,
    ...options.env,
  });
  const logger = options.logger ?? createLogger('silent');
  const jobs = options.background ? await startJobQueue(database.url, logger) : null;
  const events = options.background ? listenForEvents(database.url, logger) : null;
  await events?.ready;
  const deps = createDeps({ env, database, logger, clock: clock.now, jobs, events });
  // Wall-clock daily sweeps would make a test depend on the hour it runs; tests call them directly.
  if (jobs) await startWorkers(deps, { dailySweeps: false });
  const app = createApp(deps);
  server.on('request', app);

  const stack: TestStack = {
    origin,
    app,
    deps,
    database,
    idp,
    mail,
    payments,
    push,
    clock,
    sameOrigin: { origin, 'x-requested-with': 'brinewatch' },
    forge:
      proxy?.forgeNext ??
      (() => {
        throw new Error('start the stack with forgingProxy: true');
      }),
    async close() {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await jobs?.stop({ graceful: false, timeout: 2000 });
      await events?.close();
      await deps.reads.close();
      await push?.close();
      await proxy?.close();
      await idp.close();
      await mail.close();
      await payments.close();
      deps.storage.close();
      await storage.close();
      rmSync(storageDir, { recursive: true, force: true });
      await database.drop();
    },
  };
  return stack;
}

/** Registers the person at the identity provider (once) so they can sign in. */
export function enrol(stack: TestStack, person: TestPerson) {
  stack.idp.addAccount({
    sub: person.sub,
    email: person.email,
    name: person.name,
    password: person.password,
  });
}

/** Goes from the app's /auth/login to the provider's sign-in page; returns the page and its form. */
export async function openSignInPage(stack: TestStack, browser: HttpBrowser, returnTo?: string) {
  const login = await browser.visit(
    `${stack.origin}/auth/login${returnTo ? `?returnTo=${encodeURIComponent(returnTo)}` : ''}`,
  );
  if (login.status !== 303) throw new Error(`login answered ${login.status}`);
  const authorizationUrl = location(login, stack.origin);
  const page = await browser.followWithin(stack.idp.issuer, authorizationUrl);
  if (typeof page === 'string') throw new Error(`left the provider early: ${page}`);
  const html = await page.text();
  return { authorizationUrl, html, form: readForm(html, page.url || authorizationUrl) };
}

/** Submits the provider's form and follows it back to the app's callback URL (not visited). */
export async function submitSignIn(
  stack: TestStack,
  browser: HttpBrowser,
  action: string,
  person: { email: string; password: string },
): Promise<string> {
  const submitted = await browser.postForm(action, { email: person.email, password: person.password });
  if (submitted.status !== 303) throw new Error(`sign-in form answered ${submitted.status}`);
  const callback = await browser.followWithin(stack.idp.issuer, location(submitted, action));
  if (typeof callback !== 'string') throw new Error(`stopped at the provider with ${callback.status}`);
  return callback;
}

/** The whole sign-in, as a browser does it; returns where the app sent the browser at the end. */
export async function signIn(stack: TestStack, browser: HttpBrowser, person: TestPerson, returnTo?: string) {
  enrolOnce(stack, person);
  const login = await browser.visit(
    `${stack.origin}/auth/login${returnTo ? `?returnTo=${encodeURIComponent(returnTo)}` : ''}`,
  );
  const authorizationUrl = location(login, stack.origin);
  const page = await browser.followWithin(stack.idp.issuer, authorizationUrl);
  // Still signed in at the provider: it sends the browser straight back.
  const callback =
    typeof page === 'string'
      ? page
      : await submitSignIn(
          stack,
          browser,
          readForm(await page.text(), page.url || authorizationUrl).action,
          person,
        );
  const done = await browser.visit(callback);
  return done.status === 303 ? location(done, stack.origin) : `status ${done.status}`;
}

const enrolled = new WeakMap<TestStack, Set<string>>();
function enrolOnce(stack: TestStack, person: TestPerson) {
  const seen = enrolled.get(stack) ?? new Set<string>();
  enrolled.set(stack, seen);
  if (seen.has(person.sub)) return;
  seen.add(person.sub);
  enrol(stack, person);
}

/**
 * The stack's app again, on its database, sessions and clock, serving a build folder the test
 * made (the stack itself serves no client). Close it before the stack.
 */
export async function serveBuild(
  stack: TestStack,
  webDist: string,
): Promise<{ base: string; close(): void }> {
  const deps = createDeps({
    env: stack.deps.env,
    database: stack.database,
    logger: createLogger('silent'),
    clock: stack.clock.now,
    webDist,
  });
  const server = createServer(createApp(deps));
  server.listen(0, '127.0.0.1');
  await once(server, 'listening');
  return {
    base: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    close() {
      server.closeAllConnections();
      server.close();
    },
  };
}

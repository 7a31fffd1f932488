import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import webpush from 'web-push';
import { startIdentityProvider, type RunningIdentityProvider } from '../../../api/dev/identity-provider';
import { startMailServer, type RunningMailServer } from '../../../api/dev/mail-server';
import { startObjectStorage, type RunningObjectStorage } from '../../../api/dev/object-storage';
import { startPushService, type RunningPushService } from '../../../api/dev/push-service';
import { freePort } from '../../helpers/free-port';
import { HttpBrowser, location, readForm } from '../../helpers/http-browser';
import { benchIssuer, benchPassword, type BenchCompany } from '../seed/plan';
import { startApiProcess, type ApiProcess } from './api-process';
import { assertDurable, benchDataDir, startBenchCluster, type BenchCluster } from './cluster';

const client = { clientId: 'brinewatch-web', clientSecret: 'bench-client-secret-9b0d2e4f' };
const sessionSecret = 'bench-session-secret-1f8a3c6e9d2b5a7c4e0f';

export interface BenchPerson {
  id: string;
  company: BenchCompany;
  role: 'admin' | 'technician' | 'owner';
  n: number;
  subject: string;
  email: string;
  name: string;
}

/**
 * Everything a bench needs: the seeded cluster with fsync and synchronous_commit on, the hosted
 * services' stand-ins in this process, and the API in its own.
 */
export interface BenchStack {
  cluster: BenchCluster;
  /** For the bench's own queries (setup, checks, baselines). */
  pool: pg.Pool;
  api: ApiProcess;
  idp: RunningIdentityProvider;
  mail: RunningMailServer;
  push: RunningPushService;
  vapidPublicKey: string;
  /** A seeded person, looked up in bench_people. */
  person(company: BenchCompany, role: BenchPerson['role'], n: number): Promise<BenchPerson>;
  /**
   * Another API process on the same cluster and stand-ins (its own port; sessions live in the
   * database, so a cookie from `signIn` works on it too). The caller stops it.
   */
  startApi(): Promise<ApiProcess>;
  /** Signs a seeded person in through the identity provider stand-in, as a browser does. */
  signIn(person: BenchPerson): Promise<HttpBrowser>;
  /** Headers a request from the app's own pages carries on a state change. */
  sameOrigin: Record<string, string>;
  close(): Promise<void>;
}

export async function startBenchStack(): Promise<BenchStack> {
  const cluster = await startBenchCluster({ durable: true });
  const closers: Array<() => Promise<unknown>> = [() => cluster.stop()];
  const close = async () => {
    for (const step of closers.reverse()) await step().catch((error: unknown) => console.error(error));
  };
  try {
    await assertDurable(cluster.url);
    const pool = new pg.Pool({ connectionString: cluster.url, max: 12 });
    closers.push(() => pool.end());
    const seeded = await pool.query(`select to_regclass('bench_seed') is not null as ok`);
    if (!seeded.rows[0].ok)
      throw new Error(`no bench data in ${benchDataDir}: run \`npm run bench:seed\` first`);

    const port = await freePort();
    const origin = `http://localhost:${port}`;
    const issuer = new URL(benchIssuer);
    const idp = await startIdentityProvider({
      port: Number(issuer.port),
      accounts: [],
      clients: [
        { ...client, redirectUris: [`${origin}/auth/callback`], postLogoutRedirectUris: [`${origin}/`] },
      ],
    });
    closers.push(() => idp.close());
    const mail = await startMailServer({ smtpPort: 0 });
    closers.push(() => mail.close());
    const runDir = path.join(benchDataDir, 'run-stand-ins');
    mkdirSync(runDir, { recursive: true });
    const storage: RunningObjectStorage = await startObjectStorage({
      port: await freePort(),
      dir: path.join(runDir, 's3'),
      bucket: 'bench-photos',
    });
    closers.push(() => storage.close());
    const push = await startPushService({ port: 0, dir: path.join(runDir, 'push') });
    closers.push(() => push.close());
    const caFile = path.join(runDir, 'push-ca.pem');
    writeFileSync(caFile, push.caCertPem);
    const vapid = webpush.generateVAPIDKeys();

    mkdirSync('tests/artifacts', { recursive: true });
    const apiEnv = {
      NODE_ENV: 'production',
      LOG_LEVEL: process.env.BENCH_LOG_LEVEL ?? 'info',
      APP_ORIGIN: origin,
      DATABASE_URL: cluster.url,
      DATA_DIR: runDir,
      OIDC_ISSUER: idp.issuer,
      OIDC_CLIENT_ID: client.clientId,
      OIDC_CLIENT_SECRET: client.clientSecret,
      SESSION_SECRET: sessionSecret,
      SMTP_PORT: String(mail.smtpPort),
      S3_ENDPOINT: storage.endpoint,
      S3_BUCKET: storage.bucket,
      S3_ACCESS_KEY_ID: storage.accessKeyId,
      S3_SECRET_ACCESS_KEY: storage.secretAccessKey,
      VAPID_PUBLIC_KEY: vapid.publicKey,
      VAPID_PRIVATE_KEY: vapid.privateKey,
      PUSH_TRUSTED_CA_FILE: caFile,
      // One address signs in every bench person: the per-address limit would stop the harness.
      SIGN_IN_STARTS_PER_10_MIN: '100000',
    };
    const logFile = path.resolve('tests/artifacts/bench-api.log');
    const api = await startApiProcess({ port, logFile, env: apiEnv });
    closers.push(() => api.stop());

    const enrolled = new Set<string>();
    const sameOrigin = { origin, 'x-requested-with': 'brinewatch' };
    return {
      cluster,
      pool,
      api,
      idp,
      mail,
      push,
      vapidPublicKey: vapid.publicKey,
      sameOrigin,
      startApi: async () => startApiProcess({ port: await freePort(), logFile, env: apiEnv }),
      async person(company, role, n) {
        const { rows } = await pool.query<BenchPerson>(
          `select p.user_id as id, p.company, p.role, p.n, p.subject, p.email, u.name
           from bench_people p join users u on u.id = p.user_id
           where p.company = $1 and p.role = $2 and p.n = $3`,
          [company, role, n],
        );
        if (!rows[0]) throw new Error(`no seeded ${role} ${n} in company ${company}`);
        return rows[0];
      },
      async signIn(person) {
        if (!enrolled.has(person.subject)) {
          idp.addAccount({
            sub: person.subject,
            email: person.email,
            name: person.name,
            password: benchPassword,
          });
          enrolled.add(person.subject);
        }
        const browser = new HttpBrowser();
        const login = await browser.visit(`${origin}/auth/login`);
        const authorizationUrl = location(login, origin);
        const page = await browser.followWithin(idp.issuer, authorizationUrl);
        if (typeof page === 'string') throw new Error(`sign-in left the provider early: ${page}`);
        const form = readForm(await page.text(), page.url || authorizationUrl);
        const submitted = await browser.postForm(form.action, {
          email: person.email,
          password: benchPassword,
        });
        const callback = await browser.followWithin(idp.issuer, location(submitted, form.action));
        if (typeof callback !== 'string')
          throw new Error(`sign-in stopped at the provider (${callback.status})`);
        const done = await browser.visit(callback);
        const me = await browser.visit(`${origin}/api/me`);
        if (me.status !== 200) {
          throw new Error(`${person.email} is not signed in (callback ${done.status}, /api/me ${me.status})`);
        }
        return browser;
      },
      close,
    };
  } catch (error) {
    await close();
    throw error;
  }
}

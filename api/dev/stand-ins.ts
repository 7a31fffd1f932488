import path from 'node:path';
import type { Env } from '../env';
import { appOrigin } from '../env';
import { demoPassword, demoPeople } from './demo-people';
import { startIdentityProvider, type RunningIdentityProvider } from './identity-provider';
import { startMailServer, type RunningMailServer } from './mail-server';
import { startObjectStorage, type RunningObjectStorage } from './object-storage';
import { startPaymentProvider, type RunningPaymentProvider } from './payment-provider';

export interface StandIns {
  idp: RunningIdentityProvider;
  mail: RunningMailServer;
  storage: RunningObjectStorage;
  /** Null unless the payment keys are set and STRIPE_API_URL is plain http on loopback. */
  payments: RunningPaymentProvider | null;
  close(): Promise<void>;
}

const loopbackHosts = new Set(['127.0.0.1', 'localhost', '[::1]']);

/**
 * The hosted services the app talks to, run locally on loopback for the demo: the identity
 * provider (with the demo people as its accounts), the SMTP relay with a mailbox page,
 * S3-compatible object storage for photos, and the payment provider with its payment page where
 * STRIPE_API_URL points (`npm start` sets it to PAYMENTS_PORT outside production).
 */
export async function startStandIns(env: Env, options: { mailboxPort: number; dataDir?: string }) {
  const origin = appOrigin(env);
  const issuer = new URL(env.OIDC_ISSUER);
  const idp = await startIdentityProvider({
    host: issuer.hostname,
    port: Number(issuer.port),
    accounts: demoPeople.map((person) => ({
      sub: person.sub,
      email: person.email,
      name: person.name,
      password: demoPassword,
    })),
    clients: [
      {
        clientId: env.OIDC_CLIENT_ID,
        clientSecret: env.OIDC_CLIENT_SECRET,
        redirectUris: [`${origin}/auth/callback`],
        postLogoutRedirectUris: [`${origin}/`],
      },
    ],
  });
  const mail = await startMailServer({
    host: env.SMTP_HOST,
    smtpPort: env.SMTP_PORT,
    httpPort: options.mailboxPort,
  });
  const s3 = new URL(env.S3_ENDPOINT);
  const storage = await startObjectStorage({
    host: s3.hostname,
    port: Number(s3.port),
    dir: path.join(options.dataDir ?? env.DATA_DIR, 's3'),
    bucket: env.S3_BUCKET,
  });
  const paymentsApi = env.STRIPE_API_URL ? new URL(env.STRIPE_API_URL) : null;
  const payments =
    env.STRIPE_SECRET_KEY &&
    env.STRIPE_WEBHOOK_SECRET &&
    paymentsApi?.protocol === 'http:' &&
    loopbackHosts.has(paymentsApi.hostname)
      ? await startPaymentProvider({
          host: paymentsApi.hostname === '[::1]' ? '::1' : paymentsApi.hostname,
          port: Number(paymentsApi.port || 80),
          secretKey: env.STRIPE_SECRET_KEY,
          webhookSecret: env.STRIPE_WEBHOOK_SECRET,
          webhookUrl: `${origin}/api/payments/webhook`,
          dataFile: path.join(options.dataDir ?? env.DATA_DIR, 'payments', 'state.json'),
        })
      : null;
  return {
    idp,
    mail,
    storage,
    payments,
    async close() {
      await idp.close();
      await mail.close();
      await storage.close();
      await payments?.close();
    },
  } satisfies StandIns;
}

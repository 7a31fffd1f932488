import path from 'node:path';
import type { Env } from '../env';
import { appOrigin } from '../env';
import { demoPassword, demoPeople } from './demo-people';
import { startIdentityProvider, type RunningIdentityProvider } from './identity-provider';
import { startMailServer, type RunningMailServer } from './mail-server';
import { startObjectStorage, type RunningObjectStorage } from './object-storage';

export interface StandIns {
  idp: RunningIdentityProvider;
  mail: RunningMailServer;
  storage: RunningObjectStorage;
  close(): Promise<void>;
}

/**
 * The hosted services the app talks to, run locally on loopback for the demo: the identity
 * provider (with the demo people as its accounts), the SMTP relay with a mailbox page, and
 * S3-compatible object storage for photos.
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
  return {
    idp,
    mail,
    storage,
    async close() {
      await idp.close();
      await mail.close();
      await storage.close();
    },
  } satisfies StandIns;
}

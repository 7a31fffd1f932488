import type { Env } from '../env';
import { appOrigin } from '../env';
import { demoPassword, demoPeople } from './demo-people';
import { startIdentityProvider, type RunningIdentityProvider } from './identity-provider';
import { startMailServer, type RunningMailServer } from './mail-server';

export interface StandIns {
  idp: RunningIdentityProvider;
  mail: RunningMailServer;
  close(): Promise<void>;
}

/**
 * The hosted services the app talks to, run locally on loopback for the demo: the identity
 * provider (with the demo people as its accounts) and the SMTP relay with a mailbox page.
 */
export async function startStandIns(
  env: Env,
  options: { mailboxPort: number; accounts?: boolean } = { mailboxPort: 3025 },
) {
  const origin = appOrigin(env);
  const issuer = new URL(env.OIDC_ISSUER);
  const idp = await startIdentityProvider({
    host: issuer.hostname,
    port: Number(issuer.port),
    accounts:
      options.accounts === false
        ? []
        : demoPeople.map((person) => ({
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
  return {
    idp,
    mail,
    async close() {
      await idp.close();
      await mail.close();
    },
  } satisfies StandIns;
}

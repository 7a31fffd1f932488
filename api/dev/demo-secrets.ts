import { randomBytes } from 'node:crypto';
import { chmod, rename, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { loadOrCreatePrivateJson } from '../lib/private-file';

/**
 * The secrets the app refuses to start without, made for the demo instead of shipped in the code,
 * and the payment provider's test keys, which the demo's payment stand-in and the app share.
 */
export interface DemoSecrets {
  SESSION_SECRET: string;
  OIDC_CLIENT_SECRET: string;
  STRIPE_SECRET_KEY: string;
  STRIPE_WEBHOOK_SECRET: string;
}

/** Test-mode key names as the provider writes them (`sk_test_…`, `whsec_…`), random values. */
const makePaymentKeys = () => ({
  STRIPE_SECRET_KEY: `sk_test_${randomBytes(24).toString('hex')}`,
  STRIPE_WEBHOOK_SECRET: `whsec_${randomBytes(24).toString('base64')}`,
});

/**
 * The demo's own secrets: made at first start and kept in `dir/secrets.json` (mode 0600), so
 * sessions survive a restart and the identity-provider stand-in and the app agree on the client
 * secret. Production passes them through the environment; with NODE_ENV=production nothing is made
 * here and the start fails with the missing names.
 */
export async function loadOrCreateDemoSecrets(dir: string): Promise<DemoSecrets> {
  const make = (): DemoSecrets => ({
    SESSION_SECRET: randomBytes(32).toString('base64url'),
    OIDC_CLIENT_SECRET: randomBytes(32).toString('base64url'),
    ...makePaymentKeys(),
  });
  const secrets = await loadOrCreatePrivateJson(dir, 'secrets.json', make, parseDemoSecrets);
  if ('STRIPE_SECRET_KEY' in secrets) return secrets;
  // A file from before online payment: the payment keys are added and the rest kept, so nobody is
  // signed out.
  const completed: DemoSecrets = { ...secrets, ...makePaymentKeys() };
  const path = join(dir, 'secrets.json');
  const scratch = `${path}.${process.pid}.tmp`;
  await writeFile(scratch, `${JSON.stringify(completed, null, 2)}\n`, { mode: 0o600 });
  await chmod(scratch, 0o600);
  await rename(scratch, path);
  return completed;
}

type StoredSecrets = DemoSecrets | Omit<DemoSecrets, 'STRIPE_SECRET_KEY' | 'STRIPE_WEBHOOK_SECRET'>;

const secretKeyPattern = /^sk_test_\w{8,}$/;
const webhookSecretPattern = /^whsec_[\w+/=]{8,}$/;

function parseDemoSecrets(text: string, path: string): StoredSecrets {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    throw new Error(`${path} is not JSON. Delete it to make new demo secrets (everyone signs in again).`);
  }
  const { SESSION_SECRET, OIDC_CLIENT_SECRET, STRIPE_SECRET_KEY, STRIPE_WEBHOOK_SECRET } = (value ??
    {}) as Partial<Record<keyof DemoSecrets, unknown>>;
  if (
    typeof SESSION_SECRET !== 'string' ||
    SESSION_SECRET.length < 32 ||
    typeof OIDC_CLIENT_SECRET !== 'string' ||
    OIDC_CLIENT_SECRET.length < 16
  ) {
    throw new Error(`${path} lacks SESSION_SECRET or OIDC_CLIENT_SECRET. Delete it to make new ones.`);
  }
  if (STRIPE_SECRET_KEY === undefined && STRIPE_WEBHOOK_SECRET === undefined) {
    return { SESSION_SECRET, OIDC_CLIENT_SECRET };
  }
  if (
    typeof STRIPE_SECRET_KEY !== 'string' ||
    !secretKeyPattern.test(STRIPE_SECRET_KEY) ||
    typeof STRIPE_WEBHOOK_SECRET !== 'string' ||
    !webhookSecretPattern.test(STRIPE_WEBHOOK_SECRET)
  ) {
    throw new Error(
      `${path} has unusable STRIPE_SECRET_KEY or STRIPE_WEBHOOK_SECRET. Remove both from it to make new ones.`,
    );
  }
  return { SESSION_SECRET, OIDC_CLIENT_SECRET, STRIPE_SECRET_KEY, STRIPE_WEBHOOK_SECRET };
}

/**
 * The environment the demo starts with: what the caller set wins; missing secrets come from
 * DATA_DIR, except in production, which must bring its own.
 */
export async function withDemoSecrets(source: NodeJS.ProcessEnv = process.env): Promise<NodeJS.ProcessEnv> {
  const given = (name: keyof DemoSecrets) => Boolean(source[name]);
  const complete =
    given('SESSION_SECRET') &&
    given('OIDC_CLIENT_SECRET') &&
    given('STRIPE_SECRET_KEY') &&
    given('STRIPE_WEBHOOK_SECRET');
  if (source.NODE_ENV === 'production' || complete) return source;
  const secrets = await loadOrCreateDemoSecrets(join(source.DATA_DIR || '.data', 'secrets'));
  return { ...secrets, ...source };
}

import { randomBytes } from 'node:crypto';
import { join } from 'node:path';
import { loadOrCreatePrivateJson } from '../lib/private-file';

/** The secrets the app refuses to start without, made for the demo instead of shipped in the code. */
export interface DemoSecrets {
  SESSION_SECRET: string;
  OIDC_CLIENT_SECRET: string;
}

/**
 * The demo's own secrets: made at first start and kept in `dir/secrets.json` (mode 0600), so
 * sessions survive a restart and the identity-provider stand-in and the app agree on the client
 * secret. Production passes them through the environment; with NODE_ENV=production nothing is made
 * here and the start fails with the missing names.
 */
export function loadOrCreateDemoSecrets(dir: string): Promise<DemoSecrets> {
  const make = (): DemoSecrets => ({
    SESSION_SECRET: randomBytes(32).toString('base64url'),
    OIDC_CLIENT_SECRET: randomBytes(32).toString('base64url'),
  });
  return loadOrCreatePrivateJson(dir, 'secrets.json', make, parseDemoSecrets);
}

function parseDemoSecrets(text: string, path: string): DemoSecrets {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    throw new Error(`${path} is not JSON. Delete it to make new demo secrets (everyone signs in again).`);
  }
  const { SESSION_SECRET, OIDC_CLIENT_SECRET } = (value ?? {}) as Partial<Record<keyof DemoSecrets, unknown>>;
  if (
    typeof SESSION_SECRET !== 'string' ||
    SESSION_SECRET.length < 32 ||
    typeof OIDC_CLIENT_SECRET !== 'string' ||
    OIDC_CLIENT_SECRET.length < 16
  ) {
    throw new Error(`${path} lacks SESSION_SECRET or OIDC_CLIENT_SECRET. Delete it to make new ones.`);
  }
  return { SESSION_SECRET, OIDC_CLIENT_SECRET };
}

/**
 * The environment the demo starts with: what the caller set wins; missing secrets come from
 * DATA_DIR, except in production, which must bring its own.
 */
export async function withDemoSecrets(source: NodeJS.ProcessEnv = process.env): Promise<NodeJS.ProcessEnv> {
  if (source.NODE_ENV === 'production' || (source.SESSION_SECRET && source.OIDC_CLIENT_SECRET)) return source;
  const secrets = await loadOrCreateDemoSecrets(join(source.DATA_DIR || '.data', 'secrets'));
  return { ...secrets, ...source };
}

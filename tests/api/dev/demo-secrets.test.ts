import { mkdtempSync, rmSync, statSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { loadOrCreateDemoSecrets, withDemoSecrets } from '../../../api/dev/demo-secrets';
import { EnvError, parseEnv } from '../../../api/env';

describe('secrets for the demo and for production', () => {
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-secrets-'));
  afterAll(() => rmSync(dataDir, { recursive: true, force: true }));

  const problemsOf = (source: NodeJS.ProcessEnv) => {
    try {
      parseEnv(source);
    } catch (error) {
      if (error instanceof EnvError) return error.problems;
      throw error;
    }
    return [];
  };

  it('has no secret in the code: without them the environment is refused, naming each', () => {
    const problems = problemsOf({});
    expect(problems.some((line) => line.startsWith('SESSION_SECRET: required'))).toBe(true);
    expect(problems.some((line) => line.startsWith('OIDC_CLIENT_SECRET: required'))).toBe(true);
  });

  it('makes the demo its own secrets once, kept under DATA_DIR with mode 0600', async () => {
    const first = await withDemoSecrets({ DATA_DIR: dataDir });
    const second = await withDemoSecrets({ DATA_DIR: dataDir });
    const env = parseEnv(first);
    const file = path.join(dataDir, 'secrets', 'secrets.json');

    expect(env.SESSION_SECRET.length).toBeGreaterThanOrEqual(32);
    expect(env.OIDC_CLIENT_SECRET.length).toBeGreaterThanOrEqual(16);
    expect(second.SESSION_SECRET).toBe(first.SESSION_SECRET);
    expect(second.OIDC_CLIENT_SECRET).toBe(first.OIDC_CLIENT_SECRET);
    expect(statSync(file).mode & 0o777).toBe(0o600);
    const elsewhere = await loadOrCreateDemoSecrets(path.join(dataDir, 'other'));
    expect(elsewhere.SESSION_SECRET).not.toBe(first.SESSION_SECRET);
  });

  it('lets values from the environment win over the demo file', async () => {
    const source = await withDemoSecrets({ DATA_DIR: dataDir, SESSION_SECRET: 's'.repeat(40) });
    expect(source.SESSION_SECRET).toBe('s'.repeat(40));
    expect(source.OIDC_CLIENT_SECRET).toBeTruthy();
  });

  it('makes nothing in production, which refuses to start without its own secrets', async () => {
    const source = await withDemoSecrets({ NODE_ENV: 'production', DATA_DIR: path.join(dataDir, 'prod') });
    const problems = problemsOf(source);

    expect(source.SESSION_SECRET).toBeUndefined();
    expect(problems.some((line) => line.startsWith('SESSION_SECRET: required'))).toBe(true);
    expect(problems.some((line) => line.startsWith('OIDC_CLIENT_SECRET: required'))).toBe(true);
    expect(problems).toContain('S3_SECRET_ACCESS_KEY: required in production');
  });
});

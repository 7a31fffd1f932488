import { describe, expect, it } from 'vitest';
import { EnvError, parseEnv } from '../../api/env';

describe('parseEnv', () => {
  it('fills in the defaults for the demo', () => {
    const env = parseEnv({ SESSION_SECRET: 'x'.repeat(32), OIDC_CLIENT_SECRET: 'y'.repeat(16) });
    expect(env.PORT).toBe(3000);
    expect(env.PGPORT_LOCAL).toBe(54329);
  });

  it('refuses a malformed DATABASE_URL and PORT, naming both', () => {
    const attempt = () => parseEnv({ DATABASE_URL: 'mysql://nope', PORT: 'eighty' });
    expect(attempt).toThrow(EnvError);
    try {
      attempt();
    } catch (error) {
      const problems = (error as EnvError).problems.join('\n');
      expect(problems).toMatch(/^PORT: /m);
      expect(problems).toMatch(/^DATABASE_URL: must be a postgres:\/\/ URL/m);
    }
  });
});

import { chmodSync, existsSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ensurePostgresBinaries, stopLeftoverServer } from '../../../api/dev/postgres';
import {
  demoEnv,
  startDemo,
  waitForHealth,
  withDemoDatabase,
  type RunningDemo,
} from '../../helpers/demo-launcher';
import { copyProject, markClientBuilt } from '../../helpers/project-copy';

/*
 * `npm start` killed with SIGKILL leaves its PostgreSQL running on the data folder. The next start
 * must come up by itself, with the data intact, and a normal stop must leave nothing running.
 * This runs the real launcher (api/dev/start.ts) as a separate process, as `npm start` does, in a
 * copy of the project whose client counts as built, so it never rebuilds the dist/web others serve.
 */

const dataDir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-restart-'));
// The server runs as the postgres user, which must be able to reach the folder like `.data`.
chmodSync(dataDir, 0o755);
const pgDataDir = path.join(dataDir, 'postgres', 'data');
const project = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-restart-project-'));
const children: RunningDemo[] = [];
const track = (demo: RunningDemo) => (children.push(demo), demo);

afterAll(() => {
  for (const { child } of children) if (child.exitCode === null) child.kill('SIGKILL');
  if (existsSync(pgDataDir)) stopLeftoverServer(ensurePostgresBinaries(), pgDataDir, () => {});
  rmSync(dataDir, { recursive: true, force: true });
  rmSync(project, { recursive: true, force: true });
});

describe('npm start after a kill -9', () => {
  it('comes up by itself with the data intact, and a normal stop leaves no PostgreSQL behind', async () => {
    await copyProject(project);
    await markClientBuilt(project);
    const env = await demoEnv(dataDir);
    const first = track(startDemo(project, env));
    await waitForHealth(env, first);
    const before = await withDemoDatabase(env, async (client) => {
      await client.query(`comment on database brinewatch is 'written before the kill'`);
      const { rows } = await client.query<{ tanks: string }>('select count(*) as tanks from tanks');
      return Number(rows[0]!.tanks);
    });
    expect(before).toBeGreaterThan(0);

    first.child.kill('SIGKILL');
    await first.exited;
    // The kill left PostgreSQL running on the data folder: exactly what used to block the next start.
    expect(existsSync(path.join(pgDataDir, 'postmaster.pid'))).toBe(true);

    const second = track(startDemo(project, env));
    await waitForHealth(env, second);
    const after = await withDemoDatabase(env, async (client) => {
      const comment = await client.query<{ comment: string | null }>(
        `select shobj_description(oid, 'pg_database') as comment from pg_database where datname = 'brinewatch'`,
      );
      const tanks = await client.query<{ tanks: string }>('select count(*) as tanks from tanks');
      return { comment: comment.rows[0]!.comment, tanks: Number(tanks.rows[0]!.tanks) };
    });
    expect(after).toEqual({ comment: 'written before the kill', tanks: before });

    second.child.kill('SIGTERM');
    expect(await second.exited).toBe(0);
    expect(existsSync(path.join(pgDataDir, 'postmaster.pid'))).toBe(false);
  }, 600_000);
});

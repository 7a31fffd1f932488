import { chmodSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type pg from 'pg';
import { afterAll, describe, expect, it } from 'vitest';
import { ensurePostgresBinaries, stopLeftoverServer } from '../../../api/dev/postgres';
import {
  demoEnv,
  startDemo,
  waitForHealth,
  withDemoDatabase,
  type RunningDemo,
} from '../../helpers/demo-launcher';
import { copyProject } from '../../helpers/project-copy';

/*
 * `npm start` on data that is already there: the client is built only when its sources changed,
 * and the demo scenario is written once a day. The launcher runs as `npm start` runs it, in a copy
 * of the project, so its build is its own (not the dist/web other runs serve) and edits made in the
 * working tree meanwhile cannot count as a change between the two starts.
 */

const workDir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-second-start-'));
// The server runs as the postgres user, which must be able to reach the data folder.
chmodSync(workDir, 0o755);
const project = path.join(workDir, 'project');
const dataDir = path.join(workDir, 'data');
const pgDataDir = path.join(dataDir, 'postgres', 'data');
const builtIndex = path.join(project, 'dist', 'web', 'index.html');
const buildHash = path.join(project, 'dist', 'web', '.build-hash');
const children: RunningDemo[] = [];
const track = (demo: RunningDemo) => (children.push(demo), demo);

/** Today's date in UTC and in every zone the demo uses, as the seed marker counts days. */
async function demoDays(client: pg.Client): Promise<string> {
  const { rows } = await client.query<{ days: string }>(`
    select string_agg(distinct day, ',' order by day) as days from (
      select to_char(now() at time zone 'UTC', 'YYYY-MM-DD') as day
      union select to_char(now() at time zone time_zone, 'YYYY-MM-DD') from companies
      union select to_char(now() at time zone time_zone, 'YYYY-MM-DD') from tanks where time_zone is not null
    ) d`);
  return rows[0]!.days;
}

/** What a rebuild would replace: the hash's content and both files' modification times. */
function clientBuild() {
  return {
    hash: readFileSync(buildHash, 'utf8'),
    hashWritten: statSync(buildHash).mtimeMs,
    indexWritten: statSync(builtIndex).mtimeMs,
  };
}

afterAll(() => {
  for (const { child } of children) if (child.exitCode === null) child.kill('SIGKILL');
  if (existsSync(pgDataDir)) stopLeftoverServer(ensurePostgresBinaries(), pgDataDir, () => {});
  rmSync(workDir, { recursive: true, force: true });
});

describe('npm start on existing data', () => {
  it('neither builds the client nor writes the demo scenario a second time', async () => {
    await copyProject(project);
    mkdirSync(dataDir, { mode: 0o755 });
    const env = await demoEnv(dataDir);
    const first = track(startDemo(project, env));
    await waitForHealth(env, first);
    // A project without dist/ is built, and the build recorded.
    expect(existsSync(buildHash)).toBe(true);
    const built = clientBuild();
    // The scenario is written again on a new day in UTC or any of its zones, by design. A start
    // that crosses such a midnight proves nothing either way, so the check is made again on the
    // next start (two midnights never fall within one start).
    let running = first;
    for (let attempt = 1; ; attempt += 1) {
      const dayBefore = await withDemoDatabase(env, demoDays);
      // The scenario's upsert would put this name back if the next start wrote the scenario again.
      const renamed = await withDemoDatabase(env, async (client) => {
        const { rows } = await client.query<{ id: string; name: string }>(
          `update tanks set name = name || ' (renamed between starts)'
           where id = (select id from tanks order by id limit 1) returning id, name`,
        );
        return rows[0]!;
      });
      const markerBefore = await withDemoDatabase(env, (client) =>
        client
          .query('select fingerprint, seeded_at from demo_launcher.seed_marker')
          .then((result) => result.rows),
      );
      expect(markerBefore).toHaveLength(1);
      running.child.kill('SIGTERM');
      expect(await running.exited).toBe(0);

      running = track(startDemo(project, env));
      await waitForHealth(env, running);
      const dayAfter = await withDemoDatabase(env, demoDays);
      const after = await withDemoDatabase(env, async (client) => ({
        name: (await client.query('select name from tanks where id = $1', [renamed.id])).rows[0]?.name,
        marker: (await client.query('select fingerprint, seeded_at from demo_launcher.seed_marker')).rows,
      }));
      if (dayBefore !== dayAfter && attempt === 1) continue;

      expect(clientBuild()).toEqual(built);
      expect(after).toEqual({ name: renamed.name, marker: markerBefore });
      break;
    }
    running.child.kill('SIGTERM');
    expect(await running.exited).toBe(0);
  }, 600_000);
});

import { createHash } from 'node:crypto';
import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { sql } from 'drizzle-orm';
import { wallTimeOf } from '@shared/visits/recurrence';
import type { Db } from '../db/client';
import type { SeedOptions } from './seed/index';

/**
 * The demo scenario is written at most once a day by `npm start`. Its dates count back from today
 * (a tank's age, the next visits, the care tips' schedule), so a new day — in UTC or in any zone
 * the demo's companies and tanks keep — writes it again; so does a change to the scenario's own
 * files, another identity provider (the demo people's accounts are keyed by it) or another bucket
 * for the photos. `npm run db:seed` still writes it whenever asked.
 *
 * The marker is the launcher's bookkeeping, not the app's data, so it lives in its own schema
 * outside the Drizzle migrations, as pg-boss keeps its own.
 */
export type DemoSeedResult = 'seeded' | 'already-seeded';

const devDir = fileURLToPath(new URL('.', import.meta.url));

export async function seedDemoOnce(
  db: Db,
  options: SeedOptions & { storageTarget: string },
): Promise<DemoSeedResult> {
  const { storageTarget, ...seedOptions } = options;
  await db.execute(sql`
    create schema if not exists demo_launcher;
    create table if not exists demo_launcher.seed_marker (
      singleton boolean primary key default true check (singleton),
      fingerprint text not null,
      seeded_at timestamptz not null default now()
    )`);
  const fingerprint = await demoSeedFingerprint(db, {
    issuer: options.issuer,
    storageTarget,
    now: options.now ?? new Date(),
  });
  const marker = await db.execute<{ fingerprint: string }>(
    sql`select fingerprint from demo_launcher.seed_marker`,
  );
  if (marker.rows[0]?.fingerprint === fingerprint) return 'already-seeded';
  // Loaded only when needed: the scenario and its picture code are a good part of a start's imports.
  const { seedDemo } = await import('./seed/index');
  await seedDemo(db, seedOptions);
  // Only after the whole scenario is written: a start that fails half way seeds again next time.
  await db.execute(sql`
    insert into demo_launcher.seed_marker (fingerprint) values (${fingerprint})
    on conflict (singleton) do update set fingerprint = excluded.fingerprint, seeded_at = now()`);
  return 'seeded';
}

async function demoSeedFingerprint(
  db: Db,
  options: { issuer: string; storageTarget: string; now: Date },
): Promise<string> {
  const zones = await db.execute<{ zone: string }>(sql`
    select time_zone as zone from companies
    union select time_zone from tanks where time_zone is not null`);
  const days = new Set([options.now.toISOString().slice(0, 10)]);
  for (const { zone } of zones.rows) {
    try {
      days.add(wallTimeOf(options.now, zone).day);
    } catch {
      // A zone this runtime does not know leaves the UTC day to decide.
    }
  }
  const hash = createHash('sha256');
  const scenario = (await readdir(path.join(devDir, 'seed')))
    .filter((name) => name.endsWith('.ts'))
    .map((name) => `seed/${name}`)
    .sort();
  for (const file of ['demo-people.ts', 'seed-once.ts', ...scenario]) {
    hash.update(`\0${file}\0`);
    hash.update(await readFile(path.join(devDir, file)));
  }
  hash.update(
    JSON.stringify({ issuer: options.issuer, storage: options.storageTarget, days: [...days].sort() }),
  );
  return hash.digest('hex');
}

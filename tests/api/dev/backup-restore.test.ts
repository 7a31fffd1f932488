import { execFileSync } from 'node:child_process';
import { chmodSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import type { Db } from '../../../api/db/client';
import { backupPhotos, restorePhotos } from '../../../api/dev/backup-photos';
import { startObjectStorage, type RunningObjectStorage } from '../../../api/dev/object-storage';
import { ensurePostgresBinaries, startPostgres, type RunningPostgres } from '../../../api/dev/postgres';
import { seedDemo } from '../../../api/dev/seed/index';
import { photos } from '../../../api/db/schema/index';
import { parseEnv } from '../../../api/env';
import { createLogger } from '../../../api/lib/logger';
import { objectStorageFromEnv } from '../../../api/lib/object-storage';
import { startServer, type RunningServer } from '../../../api/server';
import { createTestDatabase, type TestDatabase } from '../../helpers/db';
import { freePort } from '../../helpers/free-port';

/** The README's backup commands, run for real: pg_dump -Fc, pg_restore into a fresh cluster, photos over S3. */
describe('backing up and restoring the demo', () => {
  const work = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-backup-'));
  // The fresh cluster runs as the postgres user, which must be able to reach its folder in here.
  chmodSync(work, 0o755);
  const cleanup: Array<() => Promise<unknown>> = [];
  afterAll(async () => {
    for (const step of cleanup.reverse()) await step().catch(() => undefined);
    rmSync(work, { recursive: true, force: true });
  });

  const secrets = {
    OIDC_CLIENT_SECRET: 'backup-test-client-secret',
    SESSION_SECRET: 'backup-test-session-secret-0123456789',
  };
  const storageEnv = (storage: RunningObjectStorage) => ({
    S3_ENDPOINT: storage.endpoint,
    S3_BUCKET: storage.bucket,
    S3_REGION: 'us-east-1',
    S3_ACCESS_KEY_ID: storage.accessKeyId,
    S3_SECRET_ACCESS_KEY: storage.secretAccessKey,
  });

  async function counts(db: Db) {
    const { rows } = await db.execute<{ tanks: number; readings: number; photos: number; users: number }>(sql`
      select (select count(*)::int from tanks) as tanks, (select count(*)::int from readings) as readings,
             (select count(*)::int from photos) as photos, (select count(*)::int from users) as users`);
    return rows[0]!;
  }

  it('restores the database into a fresh cluster and the photos into a fresh bucket, and the app runs on the copy', async () => {
    // Arrange: the demo in a database and a bucket of its own.
    const original: TestDatabase = await createTestDatabase();
    cleanup.push(() => original.drop());
    const bucket = await startObjectStorage({
      port: 0,
      dir: path.join(work, 's3-original'),
      bucket: 'photos',
    });
    cleanup.push(() => bucket.close());
    const originalEnv = parseEnv({ NODE_ENV: 'test', ...secrets, ...storageEnv(bucket) });
    const seedStorage = objectStorageFromEnv(originalEnv);
    await seedDemo(original.db, {
      issuer: 'http://127.0.0.1:3001',
      storage: seedStorage,
      raiseAlerts: false,
    });
    seedStorage.close();
    const before = await counts(original.db);

    // Act: back up, then restore into a new cluster and a new bucket.
    const bin = ensurePostgresBinaries(() => {});
    const dump = path.join(work, 'brinewatch.dump');
    execFileSync(path.join(bin, 'pg_dump'), ['-Fc', '-d', original.url, '-f', dump]);
    const photoFolder = path.join(work, 'photos');
    const backedUp = await backupPhotos(storageEnv(bucket), photoFolder);

    const copy: RunningPostgres = await startPostgres({
      dir: path.join(work, 'pg-copy'),
      port: await freePort(),
      database: 'brinewatch',
      durable: false,
      log: () => {},
    });
    cleanup.push(() => copy.stop());
    execFileSync(path.join(bin, 'pg_restore'), ['--no-owner', '--exit-on-error', '-d', copy.url, dump]);
    const newBucket = await startObjectStorage({
      port: 0,
      dir: path.join(work, 's3-copy'),
      bucket: 'photos',
    });
    cleanup.push(() => newBucket.close());
    const restored = await restorePhotos(storageEnv(newBucket), photoFolder);

    const server: RunningServer & { deps: { db: Db; storage: { get(key: string): Promise<unknown> } } } =
      await startServer({
        env: parseEnv({
          NODE_ENV: 'test',
          LOG_LEVEL: 'silent',
          DATABASE_URL: copy.url,
          ...secrets,
          ...storageEnv(newBucket),
        }),
        databaseUrl: copy.url,
        logger: createLogger('silent'),
        port: await freePort(),
        background: false,
        serveClient: false,
      });
    cleanup.push(() => server.close());

    // Assert: the copy answers, holds the same demo, and serves its photos.
    const health = await fetch(`${server.url}/api/health`);
    const after = await counts(server.deps.db);
    const [photo] = await server.deps.db.select().from(photos).limit(1);

    expect(health.status).toBe(200);
    expect(before.tanks).toBeGreaterThan(0);
    expect(before.readings).toBeGreaterThan(0);
    expect(after).toEqual(before);
    expect(backedUp).toBeGreaterThan(0);
    expect(restored).toBe(backedUp);
    expect(readdirSync(photoFolder).length).toBeGreaterThan(1);
    if (before.photos > 0) expect(await server.deps.storage.get(photo!.objectKey)).not.toBeNull();
  }, 240_000);
});

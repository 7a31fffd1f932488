import { sql } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findSpecies } from '@shared/livestock/catalogue';
import { checkCompatibility } from '@shared/livestock/compatibility';
import { equipmentInput } from '@shared/schemas/equipment';
import { demoId, seedDemo } from '../../api/dev/seed/index';
import { demoEquipment, demoLivestock, demoTanks } from '../../api/dev/seed/scenario';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { startTestStorage, type TestStorage } from './photos/test-storage';

describe('demo seed', () => {
  let database: TestDatabase;
  let s3: TestStorage;
  beforeAll(async () => {
    database = await createTestDatabase();
    s3 = await startTestStorage();
  });
  afterAll(async () => {
    await database.drop();
    await s3.close();
  });

  const counts = async () => {
    const result = await database.db.execute<Record<string, number>>(
      sql`select (select count(*)::int from companies) as companies, (select count(*)::int from users) as users,
                 (select count(*)::int from tanks) as tanks, (select count(*)::int from tank_members) as members,
                 (select count(*)::int from equipment) as equipment, (select count(*)::int from livestock) as livestock,
                 (select count(*)::int from livestock_status_events) as events,
                 (select count(*)::int from photos) as photos,
                 (select count(*)::int from tanks where cover_photo_id is not null) as covers`,
    );
    return result.rows[0];
  };

  it('writes the demo scenario, and running it again changes nothing', async () => {
    await seedDemo(database.db, { issuer: 'http://127.0.0.1:3001', storage: s3.storage });
    const first = await counts();
    const photoKeys = await database.db.execute(sql`select object_key from photos order by id`);
    await seedDemo(database.db, { issuer: 'http://127.0.0.1:3001', storage: s3.storage });

    expect(first).toEqual({
      companies: 2,
      users: 8,
      tanks: 5,
      members: 5,
      equipment: 40,
      livestock: 38,
      events: 53,
      photos: 20,
      covers: 5,
    });
    expect(await counts()).toEqual(first);
    // The photos were drawn once; the second run found them in storage.
    expect((await database.db.execute(sql`select object_key from photos order by id`)).rows).toEqual(
      photoKeys.rows,
    );
    // A year of device readings (about 840,000 rows) twice over; took about 50 s on a loaded 2-core
    // machine, so this bounds a hang, not the speed.
  }, 300_000);

  it('stores each photo as a re-encoded WebP the API can serve', async () => {
    const cover = demoId('photo:ashdown-reef:cover');
    const [row] = (
      await database.db.execute<{ object_key: string; width: number }>(
        sql`select object_key, width from photos where id = ${cover}`,
      )
    ).rows;
    const object = await s3.storage.get(row!.object_key);
    const chunks: Buffer[] = [];
    for await (const chunk of object!.body) chunks.push(chunk as Buffer);

    expect(await sharp(Buffer.concat(chunks)).metadata()).toMatchObject({
      format: 'webp',
      width: row!.width,
    });
  });

  it('keeps to the catalogue, valid equipment and a story with a compatibility tension', () => {
    for (const tank of demoTanks) {
      for (const animal of demoLivestock[tank.key])
        expect(findSpecies(animal.speciesId), animal.speciesId).toBeDefined();
      for (const item of demoEquipment[tank.key]) {
        const { key: _key, installedDaysAgo: _i, lastServicedDaysAgo: _l, ...fields } = item;
        expect(equipmentInput.safeParse(fields).success, item.key).toBe(true);
      }
    }
    const reef = demoLivestock['ashdown-reef'].filter((animal) => animal.key !== 'anemone');
    const warnings = checkCompatibility(
      findSpecies('bubble-tip-anemone')!,
      reef.map((animal) => ({ species: findSpecies(animal.speciesId)! })),
      { waterType: 'marine' },
    );
    expect(warnings.map((warning) => warning.kind)).toContain('stings-neighbours');
  });
});

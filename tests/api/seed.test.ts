import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../../api/db/seed/index';
import { createTestDatabase, type TestDatabase } from '../helpers/db';

describe('demo seed', () => {
  let database: TestDatabase;
  beforeAll(async () => {
    database = await createTestDatabase();
  });
  afterAll(() => database.drop());

  const counts = async () => {
    const result = await database.db.execute<{
      companies: number;
      users: number;
      tanks: number;
      members: number;
    }>(
      sql`select (select count(*)::int from companies) as companies, (select count(*)::int from users) as users,
                 (select count(*)::int from tanks) as tanks, (select count(*)::int from tank_members) as members`,
    );
    return result.rows[0];
  };

  it('writes the demo scenario, and running it again changes nothing', async () => {
    await seedDemo(database.db, { issuer: 'http://127.0.0.1:3001' });
    const first = await counts();
    await seedDemo(database.db, { issuer: 'http://127.0.0.1:3001' });

    expect(first).toEqual({ companies: 2, users: 8, tanks: 5, members: 5 });
    expect(await counts()).toEqual(first);
  });
});

import { sql } from 'drizzle-orm';
import { demoPeople } from '../../dev/demo-people';
import type { Db } from '../client';
import { companies, users } from '../schema/index';

export const demoCompanies = [
  { slug: 'driftglass', name: 'Driftglass Aquatic Care', timeZone: 'Europe/London' },
  { slug: 'northpool', name: 'Northpool Aquaria', timeZone: 'Europe/Dublin' },
] as const;

/**
 * Writes the invented demo scenario. Idempotent: rows are keyed by natural keys
 * (company slug, identity) and updated in place, so running it twice changes nothing.
 */
export async function seedDemo(db: Db, options: { issuer: string }): Promise<void> {
  await db.transaction(async (tx) => {
    const companyRows = await tx
      .insert(companies)
      .values([...demoCompanies])
      .onConflictDoUpdate({
        target: companies.slug,
        set: { name: sql`excluded.name`, timeZone: sql`excluded.time_zone` },
      })
      .returning({ id: companies.id, slug: companies.slug });
    const companyId = new Map(companyRows.map((row) => [row.slug, row.id]));

    await tx
      .insert(users)
      .values(
        demoPeople.map((person) => ({
          companyId: companyId.get(person.company)!,
          issuer: options.issuer,
          subject: person.sub,
          email: person.email,
          name: person.name,
          role: person.role,
        })),
      )
      .onConflictDoUpdate({
        target: [users.issuer, users.subject],
        set: { email: sql`excluded.email`, name: sql`excluded.name`, role: sql`excluded.role` },
      });
  });
}

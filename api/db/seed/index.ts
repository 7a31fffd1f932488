import { createHash } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { demoPeople } from '../../dev/demo-people';
import type { Db } from '../client';
import { companies, tankMembers, tanks, users } from '../schema/index';

/** Stable ids for demo rows (name-based, like UUID v5), so seeding twice updates in place. */
export function demoId(key: string): string {
  const hex = createHash('sha1').update(`brinewatch-demo:${key}`).digest('hex');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-5${hex.slice(13, 16)}-a${hex.slice(17, 20)}-${hex.slice(20, 32)}`;
}

export const demoTanks = [
  {
    key: 'ashdown-reef',
    name: 'Living room reef',
    siteLabel: 'Ashdown family home — living room',
    owners: ['u-helen'],
  },
  {
    key: 'ashdown-river',
    name: "Kids' river tank",
    siteLabel: 'Ashdown family home — playroom',
    owners: ['u-helen'],
  },
  {
    key: 'quayside-reef',
    name: 'Waiting room reef',
    siteLabel: 'Quayside Dental — waiting room',
    owners: ['u-felix'],
  },
  {
    key: 'saltfig-lagoon',
    name: 'Dining room lagoon',
    siteLabel: 'Salt Fig Kitchen — dining room',
    owners: ['u-rosa'],
  },
  {
    key: 'ferrous-planted',
    name: 'Reception planted tank',
    siteLabel: 'Ferrous Studio — reception',
    owners: ['u-sam'],
  },
] as const;

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

    const userRows = await tx
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
      })
      .returning({ id: users.id, subject: users.subject });
    const userId = new Map(userRows.map((row) => [row.subject, row.id]));

    const driftglass = companyId.get('driftglass')!;
    await tx
      .insert(tanks)
      .values(
        demoTanks.map((t) => ({
          id: demoId(t.key),
          companyId: driftglass,
          name: t.name,
          siteLabel: t.siteLabel,
        })),
      )
      .onConflictDoUpdate({
        target: tanks.id,
        set: { name: sql`excluded.name`, siteLabel: sql`excluded.site_label` },
      });
    await tx
      .insert(tankMembers)
      .values(
        demoTanks.flatMap((t) =>
          t.owners.map((sub) => ({ tankId: demoId(t.key), userId: userId.get(sub)! })),
        ),
      )
      .onConflictDoNothing();
  });
}

import { randomBytes } from 'node:crypto';
import type { Db } from '../../api/db/client';
import { companies, tankMembers, tanks, users } from '../../api/db/schema/index';
import type { Role } from '../../api/services/actors';

const unique = () => randomBytes(4).toString('hex');

export async function createCompany(db: Db, overrides: Partial<typeof companies.$inferInsert> = {}) {
  const id = unique();
  const [company] = await db
    .insert(companies)
    .values({ slug: `company-${id}`, name: `Test Aquatics ${id}`, timeZone: 'Europe/London', ...overrides })
    .returning();
  return company!;
}

export interface TestPerson {
  id: string;
  companyId: string;
  role: Role;
  name: string;
  email: string;
  sub: string;
  password: string;
}

/** A user row plus the matching account at the identity provider. */
export async function createPerson(
  db: Db,
  options: { companyId: string; role: Role; issuer: string; name?: string },
): Promise<TestPerson> {
  const id = unique();
  const person = {
    sub: `sub-${id}`,
    email: `${options.role}-${id}@example.test`,
    name: options.name ?? `Test ${options.role} ${id}`,
    password: `pw-${id}-${unique()}`,
  };
  const [row] = await db
    .insert(users)
    .values({
      companyId: options.companyId,
      issuer: options.issuer,
      subject: person.sub,
      email: person.email,
      name: person.name,
      role: options.role,
    })
    .returning();
  return { ...person, id: row!.id, companyId: row!.companyId, role: options.role };
}

export async function createTank(
  db: Db,
  options: { companyId: string; name?: string; owners?: { id: string }[] },
) {
  const [tank] = await db
    .insert(tanks)
    .values({ companyId: options.companyId, name: options.name ?? `Tank ${unique()}` })
    .returning();
  for (const owner of options.owners ?? []) {
    await db.insert(tankMembers).values({ tankId: tank!.id, userId: owner.id });
  }
  return tank!;
}

import { randomBytes } from 'node:crypto';
import type { Db } from '../../api/db/client';
import {
  companies,
  equipment,
  livestock,
  livestockStatusEvents,
  readings,
  tankMembers,
  tanks,
  users,
} from '../../api/db/schema/index';
import type { ParameterKey } from '@shared/parameters/keys';
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
  options: { companyId: string; name?: string; owners?: { id: string }[] } & Partial<
    Omit<typeof tanks.$inferInsert, 'companyId' | 'name'>
  >,
) {
  const { owners: _owners, ...columns } = options;
  const [tank] = await db
    .insert(tanks)
    .values({ ...columns, name: options.name ?? `Tank ${unique()}` })
    .returning();
  for (const owner of options.owners ?? []) {
    await db.insert(tankMembers).values({ tankId: tank!.id, userId: owner.id });
  }
  return tank!;
}

/** Readings as the readings API stores them; `source` defaults to a device reading. */
export async function insertReadings(
  db: Db,
  tank: { id: string; companyId: string },
  list: Array<{
    parameter: ParameterKey;
    value: number;
    measuredAt: Date;
    source?: 'visit' | 'home-test' | 'device';
  }>,
) {
  if (list.length === 0) return [];
  const rows = list.map((r) => ({
    companyId: tank.companyId,
    tankId: tank.id,
    parameter: r.parameter,
    value: r.value,
    enteredValue: r.value,
    enteredUnit: 'stored',
    measuredAt: r.measuredAt,
    source: r.source ?? ('device' as const),
  }));
  await db.insert(readings).values(rows);
  return rows.map((r) => ({
    parameter: r.parameter,
    value: r.value,
    measuredAt: r.measuredAt,
    source: r.source,
  }));
}

/** An animal already in the tank (catalogue species), with the first line of its history. */
export async function addLivestockTo(
  db: Db,
  tank: { id: string; companyId: string },
  options: Partial<typeof livestock.$inferInsert> & { catalogueSpeciesId: string; changedAt?: Date },
) {
  // A day ago by default, so anything a test records "now" comes after it.
  const { changedAt = new Date(Date.now() - 86_400_000), ...columns } = options;
  const [row] = await db
    .insert(livestock)
    .values({ companyId: tank.companyId, tankId: tank.id, ...columns })
    .returning();
  await db
    .insert(livestockStatusEvents)
    .values({ livestockId: row!.id, status: row!.status, note: 'Added to the tank.', changedAt });
  return row!;
}

export async function addEquipmentTo(
  db: Db,
  tank: { id: string; companyId: string },
  options: Partial<typeof equipment.$inferInsert> = {},
) {
  const [row] = await db
    .insert(equipment)
    .values({
      companyId: tank.companyId,
      tankId: tank.id,
      kind: 'heater',
      description: `Heater ${unique()}`,
      ...options,
    })
    .returning();
  return row!;
}

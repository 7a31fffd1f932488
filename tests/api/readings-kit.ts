import { eq } from 'drizzle-orm';
import type { Db } from '../../api/db/client';
import { companies, readings, tanks } from '../../api/db/schema/index';
import type { Actor } from '../../api/services/actors';
import { noRequest } from '../../api/services/audit';
import { createDevice } from '../../api/services/devices';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { HttpBrowser } from '../helpers/http-browser';
import { signIn, type TestStack } from '../helpers/stack';

export type Who = 'owner' | 'otherOwner' | 'technician' | 'admin' | 'stranger';

/** A company with an owner's tank, a second owner, staff, and another company's admin and tank. */
export async function readingsWorld(stack: TestStack, options: { signIn?: Who[] } = {}) {
  const { db } = stack.database;
  const issuer = stack.idp.issuer;
  const company = await createCompany(db);
  const other = await createCompany(db);
  const people = {
    owner: await createPerson(db, { companyId: company.id, role: 'owner', issuer }),
    otherOwner: await createPerson(db, { companyId: company.id, role: 'owner', issuer }),
    technician: await createPerson(db, { companyId: company.id, role: 'technician', issuer }),
    admin: await createPerson(db, { companyId: company.id, role: 'admin', issuer }),
    stranger: await createPerson(db, { companyId: other.id, role: 'admin', issuer }),
  } satisfies Record<Who, TestPerson>;
  const tank = await createTank(db, { companyId: company.id, name: 'Reef', owners: [people.owner] });
  const otherTank = await createTank(db, { companyId: other.id, name: 'Elsewhere' });
  // A year of history must be allowed: the tank was set up long before it joined Brinewatch.
  await db.update(tanks).set({ setUpOn: '2020-01-01' }).where(eq(tanks.id, tank.id));
  const browsers = {} as Record<Who, HttpBrowser>;
  for (const who of options.signIn ?? (Object.keys(people) as Who[])) {
    browsers[who] = new HttpBrowser();
    await signIn(stack, browsers[who], people[who]);
  }
  const call = async (who: Who, method: string, path: string, body?: unknown) => {
    const browser = browsers[who];
    if (!browser) throw new Error(`${who} is not signed in`);
    const res = await browser.visit(`${stack.origin}${path}`, {
      method,
      headers: { ...stack.sameOrigin, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const text = await res.text();
    let json: unknown = null;
    try {
      json = JSON.parse(text);
    } catch {
      json = text;
    }
    // eslint-disable-next-line @typescript-eslint/no-explicit-any -- tests read whatever the API answered
    return { status: res.status, headers: res.headers, body: json as any };
  };
  return { company, other, people, tank, otherTank, browsers, call };
}

export async function actorOf(db: Db, person: TestPerson): Promise<Actor> {
  const [company] = await db.select().from(companies).where(eq(companies.id, person.companyId));
  return {
    id: person.id,
    companyId: person.companyId,
    companyName: company!.name,
    role: person.role,
    name: person.name,
    email: person.email,
  };
}

/** A device on the tank, created as the technician would; returns its one-time token. */
export async function deviceFor(db: Db, technician: TestPerson, tankId: string, name = 'Probe') {
  const created = await createDevice(db, await actorOf(db, technician), tankId, name, noRequest(new Date()));
  return { ...created.device, token: created.token };
}

export async function readingCount(db: Db, tankId: string): Promise<number> {
  return (await db.select({ id: readings.id }).from(readings).where(eq(readings.tankId, tankId))).length;
}

export const minutesAgo = (now: Date, n: number) => new Date(now.getTime() - n * 60_000).toISOString();

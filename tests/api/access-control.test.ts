import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { tanks, users } from '../../api/db/schema/index';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { HttpBrowser } from '../helpers/http-browser';
import { signIn, startTestStack, type TestStack } from '../helpers/stack';

type Who = 'anonymous' | 'ownerA' | 'ownerB' | 'technician' | 'admin' | 'otherAdmin';

/**
 * The role × route matrix (OWASP ASVS V8): every route answered for every kind of caller,
 * and other tenants' objects answering 404 exactly like missing ones, left unchanged.
 */
describe('access control', () => {
  let stack: TestStack;
  const people = {} as Record<Exclude<Who, 'anonymous'>, TestPerson>;
  const browsers = {} as Record<Who, HttpBrowser>;
  let tankA: { id: string };
  let tankB: { id: string };
  let otherTank: { id: string };

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    const company = await createCompany(db);
    const other = await createCompany(db);
    people.ownerA = await createPerson(db, { companyId: company.id, role: 'owner', issuer });
    people.ownerB = await createPerson(db, { companyId: company.id, role: 'owner', issuer });
    people.technician = await createPerson(db, { companyId: company.id, role: 'technician', issuer });
    people.admin = await createPerson(db, { companyId: company.id, role: 'admin', issuer });
    people.otherAdmin = await createPerson(db, { companyId: other.id, role: 'admin', issuer });
    tankA = await createTank(db, { companyId: company.id, name: 'Tank A', owners: [people.ownerA] });
    tankB = await createTank(db, { companyId: company.id, name: 'Tank B', owners: [people.ownerB] });
    otherTank = await createTank(db, { companyId: other.id, name: 'Elsewhere' });
    browsers.anonymous = new HttpBrowser();
    for (const who of Object.keys(people) as Exclude<Who, 'anonymous'>[]) {
      browsers[who] = new HttpBrowser();
      await signIn(stack, browsers[who], people[who]);
    }
  });
  afterAll(() => stack.close());

  const call = async (who: Who, method: string, path: string, body?: unknown) => {
    const res = await browsers[who].visit(
      `${stack.origin}${path.replace(':tankA', tankA.id).replace(':tankB', tankB.id)}`,
      {
        method,
        headers: { ...stack.sameOrigin, ...(body ? { 'content-type': 'application/json' } : {}) },
        body: body ? JSON.stringify(body) : undefined,
      },
    );
    return res.status;
  };

  const matrix: Array<[string, string, Record<Who, number>, unknown?]> = [
    [
      'GET',
      '/api/me',
      { anonymous: 401, ownerA: 200, ownerB: 200, technician: 200, admin: 200, otherAdmin: 200 },
    ],
    [
      'GET',
      '/api/tanks',
      { anonymous: 401, ownerA: 200, ownerB: 200, technician: 200, admin: 200, otherAdmin: 200 },
    ],
    [
      'GET',
      '/api/tanks/:tankA',
      { anonymous: 401, ownerA: 200, ownerB: 404, technician: 200, admin: 200, otherAdmin: 404 },
    ],
    [
      'GET',
      '/api/tanks/:tankB',
      { anonymous: 401, ownerA: 404, ownerB: 200, technician: 200, admin: 200, otherAdmin: 404 },
    ],
    [
      'GET',
      '/api/clients',
      { anonymous: 401, ownerA: 403, ownerB: 403, technician: 200, admin: 200, otherAdmin: 200 },
    ],
    [
      'GET',
      '/api/staff',
      { anonymous: 401, ownerA: 403, ownerB: 403, technician: 403, admin: 200, otherAdmin: 200 },
    ],
    [
      'GET',
      '/api/invitations',
      { anonymous: 401, ownerA: 403, ownerB: 403, technician: 403, admin: 200, otherAdmin: 200 },
    ],
  ];

  for (const [method, path, expected] of matrix) {
    it(`${method} ${path} answers each caller as expected`, async () => {
      const actual = {} as Record<Who, number>;
      for (const who of Object.keys(expected) as Who[]) actual[who] = await call(who, method, path);
      expect(actual).toEqual(expected);
    });
  }

  it('lists only the tanks each caller may see', async () => {
    const names = async (who: Who) =>
      ((await (await browsers[who].visit(`${stack.origin}/api/tanks`)).json()) as { name: string }[]).map(
        (t) => t.name,
      );
    expect(await names('ownerA')).toEqual(['Tank A']);
    expect(await names('ownerB')).toEqual(['Tank B']);
    expect(await names('technician')).toEqual(['Tank A', 'Tank B']);
    expect(await names('otherAdmin')).toEqual(['Elsewhere']);
  });

  it("answers another company's tank with the same 404 as a missing one", async () => {
    const foreign = await browsers.admin.visit(`${stack.origin}/api/tanks/${otherTank.id}`);
    const missing = await browsers.admin.visit(
      `${stack.origin}/api/tanks/00000000-0000-4000-8000-000000000000`,
    );
    expect(foreign.status).toBe(404);
    expect(await foreign.json()).toEqual(await missing.json());
  });

  it("cannot change another company's staff, and the row stays as it was", async () => {
    const { db } = stack.database;
    const [before] = await db.select().from(users).where(eq(users.id, people.admin.id));
    const role = await call('otherAdmin', 'PATCH', `/api/staff/${people.admin.id}`, { role: 'technician' });
    const deactivate = await call('otherAdmin', 'POST', `/api/users/${people.technician.id}/deactivate`);
    const [after] = await db.select().from(users).where(eq(users.id, people.admin.id));
    const [tech] = await db.select().from(users).where(eq(users.id, people.technician.id));

    expect([role, deactivate]).toEqual([404, 404]);
    expect(after).toEqual(before);
    expect(tech!.status).toBe('active');
  });

  it("cannot invite a client to another company's tank", async () => {
    const status = await call('otherAdmin', 'POST', '/api/invitations', {
      role: 'owner',
      email: 'x@example.test',
      tankId: tankA.id,
    });
    expect(status).toBe(404);
    const [tank] = await stack.database.db.select().from(tanks).where(eq(tanks.id, tankA.id));
    expect(tank!.name).toBe('Tank A');
  });

  it('refuses a cross-origin state change with 403, and accepts the same request from the app', async () => {
    const target = `${stack.origin}/api/invitations`;
    const body = JSON.stringify({ role: 'technician', email: 'csrf-check@example.test' });
    const crossSite = await browsers.admin.visit(target, {
      method: 'POST',
      headers: {
        origin: 'https://evil.test',
        'x-requested-with': 'brinewatch',
        'content-type': 'application/json',
      },
      body,
    });
    const noHeader = await browsers.admin.visit(target, {
      method: 'POST',
      headers: { origin: stack.origin, 'content-type': 'application/json' },
      body,
    });
    const fromApp = await browsers.admin.visit(target, {
      method: 'POST',
      headers: { ...stack.sameOrigin, 'content-type': 'application/json' },
      body,
    });

    expect(crossSite.status).toBe(403);
    expect(noHeader.status).toBe(403);
    expect(fromApp.status).toBe(201);
  });

  it("ends a deactivated person's live session at their next request", async () => {
    const { db } = stack.database;
    const tech = await createPerson(db, {
      companyId: people.admin.companyId,
      role: 'technician',
      issuer: stack.idp.issuer,
    });
    const browser = new HttpBrowser();
    await signIn(stack, browser, tech);
    expect((await browser.visit(`${stack.origin}/api/me`)).status).toBe(200);

    const status = await call('admin', 'POST', `/api/users/${tech.id}/deactivate`);

    expect(status).toBe(200);
    expect((await browser.visit(`${stack.origin}/api/me`)).status).toBe(401);
    const again = await signIn(stack, browser, tech);
    expect(again).toBe(`${stack.origin}/no-access`);
  });

  it('applies a role change at the next request', async () => {
    const { db } = stack.database;
    const tech = await createPerson(db, {
      companyId: people.admin.companyId,
      role: 'technician',
      issuer: stack.idp.issuer,
    });
    const browser = new HttpBrowser();
    await signIn(stack, browser, tech);
    expect((await browser.visit(`${stack.origin}/api/staff`)).status).toBe(403);

    expect(await call('admin', 'PATCH', `/api/staff/${tech.id}`, { role: 'admin' })).toBe(200);

    expect((await browser.visit(`${stack.origin}/api/staff`)).status).toBe(200);
  });
});

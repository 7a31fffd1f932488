import { randomBytes } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../api/app';
import { connectDatabase, type Database } from '../../api/db/client';
import { createDeps } from '../../api/deps';
import { createLogger } from '../../api/lib/logger';
import { invitationOpenLimit, signInStartLimit } from '../../api/routes/auth';
import { deviceTokenFailureLimit, ingestRateLimit } from '../../api/routes/ingest';
import { createTestApp, type TestApp } from '../helpers/app';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { HttpBrowser, location } from '../helpers/http-browser';
import { enrol, openSignInPage, startTestStack, submitSignIn, type TestStack } from '../helpers/stack';
import { deviceFor } from './readings-kit';

describe('rate limits across API processes', () => {
  let first: TestApp;
  let secondDatabase: Database;
  let second: ReturnType<typeof createApp>;

  beforeAll(async () => {
    first = await createTestApp();
    // Another process: its own pool and app over the same database.
    secondDatabase = connectDatabase(first.database.url, { max: 2 });
    second = createApp(
      createDeps({ env: first.env, database: secondDatabase, logger: createLogger('silent') }),
    );
  });
  afterAll(async () => {
    await secondDatabase.pool.end();
    await first.close();
  });

  async function freshDevice() {
    const { db } = first.database;
    const company = await createCompany(db);
    const technician = await createPerson(db, {
      companyId: company.id,
      role: 'technician',
      issuer: 'https://identity.example.test',
    });
    const tank = await createTank(db, { companyId: company.id });
    return deviceFor(db, technician, tank.id);
  }

  const ingest = (app: ReturnType<typeof createApp>, token: string) =>
    request(app)
      .post('/api/ingest/readings')
      .set('authorization', `Bearer ${token}`)
      .send({
        readings: [{ parameter: 'temperature', value: 25, unit: '°C', measuredAt: new Date().toISOString() }],
      });

  it('counts one device’s requests to two app instances against one budget', async () => {
    const device = await freshDevice();
    const statuses: number[] = [];
    for (let i = 0; i < ingestRateLimit.points; i += 1) {
      statuses.push((await ingest(i % 2 === 0 ? first.app : second, device.token)).status);
    }

    const overFirst = await ingest(first.app, device.token);
    const overSecond = await ingest(second, device.token);

    expect(statuses.every((status) => status === 200)).toBe(true);
    for (const refused of [overFirst, overSecond]) {
      expect(refused.status).toBe(429);
      expect(refused.body.error.code).toBe('rate_limited');
      expect(typeof refused.body.error.message).toBe('string');
      const retryAfter = Number(refused.headers['retry-after']);
      expect(retryAfter).toBeGreaterThan(0);
      expect(retryAfter).toBeLessThanOrEqual(ingestRateLimit.durationS);
    }
  });
});

describe('GET /auth/login (sign-in start)', () => {
  let stack: TestStack;
  let owner: TestPerson;

  beforeAll(async () => {
    stack = await startTestStack();
    const company = await createCompany(stack.database.db);
    owner = await createPerson(stack.database.db, {
      companyId: company.id,
      role: 'owner',
      issuer: stack.idp.issuer,
    });
    enrol(stack, owner);
  });
  afterAll(() => stack.close());

  const sessionRows = async () =>
    Number((await stack.database.pool.query('select count(*) as n from session')).rows[0].n);

  it('keeps the pre-login state in a short-lived HttpOnly, SameSite=Lax cookie, not a session row', async () => {
    const login = await new HttpBrowser().visit(`${stack.origin}/auth/login`, {
      headers: { 'x-forwarded-for': '198.51.100.1' },
    });
    const cookies = login.headers.getSetCookie();

    expect(login.status).toBe(303);
    expect(cookies).toHaveLength(1);
    expect(cookies[0]).toMatch(/^bw_login=v1\./);
    expect(cookies[0]).toMatch(/HttpOnly/i);
    expect(cookies[0]).toMatch(/SameSite=Lax/i);
    expect(cookies[0]).toMatch(/Max-Age=600\b/);
    expect(await sessionRows()).toBe(0);
  });

  it('makes the session row only when the person comes back from the provider', async () => {
    const browser = new HttpBrowser();
    const { form } = await openSignInPage(stack, browser);
    const callback = await submitSignIn(stack, browser, form.action, owner);
    const before = await sessionRows();

    const done = await browser.visit(callback);

    expect(before).toBe(0);
    expect(location(done, stack.origin)).toBe(`${stack.origin}/tanks`);
    expect(await sessionRows()).toBe(1);
    expect(browser.cookies(stack.origin).has('bw_login')).toBe(false);
  });

  it('answers 100 anonymous starts from one address with 429 after the limit, and stores no session', async () => {
    const address = '198.51.100.2';
    const statuses: number[] = [];
    let refused: { body: unknown; retryAfter: string | null } | undefined;
    for (let i = 0; i < 100; i += 1) {
      const res = await fetch(`${stack.origin}/auth/login`, {
        redirect: 'manual',
        headers: { 'x-forwarded-for': address },
      });
      statuses.push(res.status);
      const body = await res.text();
      if (res.status === 429)
        refused ??= { body: JSON.parse(body), retryAfter: res.headers.get('retry-after') };
    }
    const otherAddress = await fetch(`${stack.origin}/auth/login`, {
      redirect: 'manual',
      headers: { 'x-forwarded-for': '198.51.100.3' },
    });

    expect(statuses.slice(0, signInStartLimit.points).every((s) => s === 303)).toBe(true);
    expect(statuses.slice(signInStartLimit.points).every((s) => s === 429)).toBe(true);
    expect(refused?.body).toMatchObject({ error: { code: 'rate_limited' } });
    const retryAfter = Number(refused?.retryAfter);
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(signInStartLimit.durationS);
    expect(otherAddress.status).toBe(303);
    // The one row is the sign-in completed above; anonymous starts leave none behind.
    expect(await sessionRows()).toBe(1);
  });

  it('refuses a pre-login cookie that was tampered with', async () => {
    const browser = new HttpBrowser();
    const { form } = await openSignInPage(stack, browser);
    const callback = await submitSignIn(stack, browser, form.action, owner);
    const jar = browser.cookies(stack.origin);
    const [version, iv, body = '', tag] = jar.get('bw_login')!.split('.');
    const flipped = `${body[0] === 'A' ? 'B' : 'A'}${body.slice(1)}`;
    jar.set('bw_login', [version, iv, flipped, tag].join('.'));

    const done = await browser.visit(callback);

    expect(location(done, stack.origin)).toBe(`${stack.origin}/sign-in-problem`);
    expect((await browser.visit(`${stack.origin}/api/me`)).status).toBe(401);
  });
});

describe('GET /auth/invitation/:token (opening an invitation link)', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  const open = (address: string) =>
    request(t.app)
      .get(`/auth/invitation/${randomBytes(32).toString('base64url')}`)
      .set('x-forwarded-for', address);

  it('limits the links one address may open, and not another address', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < invitationOpenLimit.points; i += 1) statuses.push((await open('192.0.2.10')).status);

    const over = await open('192.0.2.10');
    const other = await open('192.0.2.11');

    expect(statuses.every((status) => status === 303)).toBe(true);
    expect(over.status).toBe(429);
    expect(over.body.error.code).toBe('rate_limited');
    expect(Number(over.headers['retry-after'])).toBeGreaterThan(0);
    expect(other.status).toBe(303);
  });
});

describe('POST /api/ingest/readings with wrong device tokens', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  async function freshDevice() {
    const { db } = t.database;
    const company = await createCompany(db);
    const technician = await createPerson(db, {
      companyId: company.id,
      role: 'technician',
      issuer: 'https://identity.example.test',
    });
    const tank = await createTank(db, { companyId: company.id });
    return deviceFor(db, technician, tank.id);
  }

  const ingestFrom = (address: string, token: string) =>
    request(t.app)
      .post('/api/ingest/readings')
      .set('authorization', `Bearer ${token}`)
      .set('x-forwarded-for', address)
      .send({
        readings: [{ parameter: 'temperature', value: 25, unit: '°C', measuredAt: new Date().toISOString() }],
      });

  it('counts only refused tokens, then answers 429 before looking at any token from that address', async () => {
    const device = await freshDevice();
    const address = '203.0.113.20';
    const good: number[] = [];
    for (let i = 0; i < 15; i += 1) good.push((await ingestFrom(address, device.token)).status);
    const wrong: number[] = [];
    for (let i = 0; i < deviceTokenFailureLimit.points; i += 1) {
      wrong.push((await ingestFrom(address, randomBytes(32).toString('base64url'))).status);
    }

    const nextWrong = await ingestFrom(address, randomBytes(32).toString('base64url'));
    const rightButBlocked = await ingestFrom(address, device.token);
    const elsewhere = await ingestFrom('203.0.113.21', device.token);

    expect(good.every((status) => status === 200)).toBe(true);
    expect(wrong.every((status) => status === 401)).toBe(true);
    expect(nextWrong.status).toBe(429);
    expect(nextWrong.body.error.code).toBe('rate_limited');
    expect(Number(nextWrong.headers['retry-after'])).toBeGreaterThan(0);
    expect(Number(nextWrong.headers['retry-after'])).toBeLessThanOrEqual(deviceTokenFailureLimit.durationS);
    expect(rightButBlocked.status).toBe(429);
    expect(elsewhere.status).toBe(200);
  });
});

import { eq } from 'drizzle-orm';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents, photos } from '../../api/db/schema/index';
import { parseEnv } from '../../api/env';
import { noRequest, recordAudit } from '../../api/services/audit';
import { storePhotoObjects } from '../../api/services/photos';
import { purgeExpiredAudit } from '../../api/services/sweeps';
import type { AuditEntry, AuditPage } from '@shared/schemas/audit';
import { days } from '../helpers/clock';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { HttpBrowser, location } from '../helpers/http-browser';
import { signIn, startTestStack, type TestStack } from '../helpers/stack';
import { makeImage } from './photos/test-images';

// Addresses from the documentation range (RFC 5737); the app trusts X-Forwarded-For from loopback.
const clientIp = '203.0.113.7';
const clientAgent = 'Audit test browser/1.0';

type Who = 'admin' | 'technician' | 'owner' | 'otherAdmin';

describe('audit trail', () => {
  let stack: TestStack;
  let company: { id: string };
  let people: Record<Who | 'colleague' | 'leaver', TestPerson>;
  let tank: { id: string; name: string };
  const browsers = {} as Record<Who, HttpBrowser>;
  let counter = 0;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    company = await createCompany(db, { name: 'Tidewater Test Aquatics' });
    const other = await createCompany(db, { name: 'Other Test Aquatics' });
    people = {
      admin: await createPerson(db, { companyId: company.id, role: 'admin', issuer, name: 'Ada Admin' }),
      technician: await createPerson(db, { companyId: company.id, role: 'technician', issuer }),
      owner: await createPerson(db, { companyId: company.id, role: 'owner', issuer }),
      colleague: await createPerson(db, {
        companyId: company.id,
        role: 'technician',
        issuer,
        name: 'Cal Colleague',
      }),
      leaver: await createPerson(db, {
        companyId: company.id,
        role: 'technician',
        issuer,
        name: 'Lee Leaver',
      }),
      otherAdmin: await createPerson(db, { companyId: other.id, role: 'admin', issuer }),
    };
    tank = await createTank(db, { companyId: company.id, name: 'Lobby reef', owners: [people.owner] });
    for (const who of ['admin', 'technician', 'owner', 'otherAdmin'] as const) {
      browsers[who] = new HttpBrowser();
      await signIn(stack, browsers[who], people[who]);
    }
  });
  afterAll(() => stack.close());
  afterEach(() => stack.clock.reset());

  async function call(who: Who, method: string, path: string, body?: unknown) {
    const res = await browsers[who].visit(`${stack.origin}${path}`, {
      method,
      headers: {
        ...(method === 'GET' ? {} : stack.sameOrigin),
        ...(body === undefined ? {} : { 'content-type': 'application/json' }),
        'x-forwarded-for': clientIp,
        'user-agent': clientAgent,
      },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const text = await res.text();
    const type = res.headers.get('content-type') ?? '';
    // eslint-disable-next-line @typescript-eslint/no-explicit-any -- tests read whatever the API answered
    const json: any = type.includes('application/json') ? JSON.parse(text) : null;
    return { status: res.status, headers: res.headers, text, body: json };
  }

  async function trail(query: Record<string, string> = {}, who: Who = 'admin'): Promise<AuditPage> {
    const res = await call(who, 'GET', `/api/audit?${new URLSearchParams({ limit: '200', ...query })}`);
    expect(res.status).toBe(200);
    return res.body as AuditPage;
  }

  /** The newest entry of an action in the admin's company. */
  async function newest(action: string): Promise<AuditEntry | undefined> {
    return (await trail({ action, limit: '1' })).entries[0];
  }

  describe('what is recorded', () => {
    it('records a sign-in with who, when, from where and the request id', async () => {
      const browser = new HttpBrowser();
      const before = Date.now();
      await signIn(stack, browser, people.technician);

      const entry = await newest('sign-in.succeeded');
      expect(entry).toMatchObject({
        action: 'sign-in.succeeded',
        actor: { id: people.technician.id, name: people.technician.name, email: people.technician.email },
        ip: '127.0.0.1',
        requestId: expect.stringMatching(/^[\w.-]{8,64}$/),
      });
      expect(entry!.userAgent).toEqual(expect.any(String));
      expect(Date.parse(entry!.at)).toBeGreaterThanOrEqual(before - 1000);
      expect(entry!.at).toMatch(/Z$/);
    });

    it('records a deactivation, the refused sign-in that follows, and the reactivation', async () => {
      const leaver = people.leaver;
      const off = await call('admin', 'POST', `/api/users/${leaver.id}/deactivate`);
      const browser = new HttpBrowser();
      const landing = await signIn(stack, browser, leaver);
      const refused = await newest('sign-in.failed');
      const on = await call('admin', 'POST', `/api/users/${leaver.id}/reactivate`);

      expect(off.status).toBe(200);
      expect(on.status).toBe(200);
      expect(landing).toBe(`${stack.origin}/no-access`);
      expect(await newest('user.deactivated')).toMatchObject({
        actor: { id: people.admin.id, name: 'Ada Admin' },
        target: { kind: 'user', id: leaver.id, label: 'Lee Leaver' },
        before: { status: 'active' },
        after: { status: 'deactivated' },
        ip: clientIp,
        userAgent: clientAgent,
      });
      expect(refused).toMatchObject({
        actor: { id: leaver.id, email: leaver.email },
        details: { reason: 'deactivated' },
        ip: '127.0.0.1',
      });
      expect(await newest('user.reactivated')).toMatchObject({
        target: { kind: 'user', id: leaver.id },
        before: { status: 'deactivated' },
        after: { status: 'active' },
      });
    });

    it('records a role change with the role before and after', async () => {
      const res = await call('admin', 'PATCH', `/api/staff/${people.colleague.id}`, { role: 'admin' });
      const entry = await newest('user.role-changed');
      await call('admin', 'PATCH', `/api/staff/${people.colleague.id}`, { role: 'technician' });

      expect(res.status).toBe(200);
      expect(entry).toMatchObject({
        actor: { id: people.admin.id },
        target: { kind: 'user', id: people.colleague.id, label: 'Cal Colleague' },
        before: { role: 'technician' },
        after: { role: 'admin' },
        ip: clientIp,
        userAgent: clientAgent,
      });
    });

    it('records nothing for a change that was refused', async () => {
      const before = await trail({ action: 'user.role-changed' });
      const res = await call('admin', 'PATCH', `/api/staff/${people.admin.id}`, { role: 'technician' });
      const after = await trail({ action: 'user.role-changed' });

      expect(res.status).toBe(409);
      expect(after.entries).toEqual(before.entries);
    });

    it('records an invitation sent and withdrawn', async () => {
      const email = 'audit-withdrawn@example.test';
      const sent = await call('admin', 'POST', '/api/invitations', { role: 'technician', email });
      const withdrawn = await call('admin', 'DELETE', `/api/invitations/${sent.body.id}`);

      expect(sent.status).toBe(201);
      expect(withdrawn.status).toBe(204);
      expect(await newest('invitation.sent')).toMatchObject({
        actor: { id: people.admin.id },
        target: { kind: 'invitation', id: sent.body.id, label: email },
        details: { role: 'technician' },
      });
      expect(await newest('invitation.revoked')).toMatchObject({
        target: { kind: 'invitation', id: sent.body.id, label: email },
      });
    });

    it('records an invitation accepted, by the person who accepted it', async () => {
      counter += 1;
      const newcomer: TestPerson = {
        id: '',
        companyId: company.id,
        role: 'owner',
        sub: `sub-audit-newcomer-${counter}`,
        email: `audit-newcomer-${counter}@example.test`,
        name: `Nia Newcomer ${counter}`,
        password: `pw-audit-newcomer-${counter}`,
      };
      const sent = await call('admin', 'POST', '/api/invitations', {
        role: 'owner',
        email: newcomer.email,
        tankId: tank.id,
      });
      const mail = await stack.mail.waitFor((m) => m.to.includes(newcomer.email));
      const link = /https?:\/\/\S+\/auth\/invitation\/[\w-]+/.exec(mail.text)![0];
      const browser = new HttpBrowser();
      const opened = await browser.visit(link);
      expect(location(opened, stack.origin)).toBe(`${stack.origin}/auth/login`);
      await signIn(stack, browser, newcomer);

      expect(await newest('invitation.accepted')).toMatchObject({
        actor: { name: newcomer.name, email: newcomer.email },
        target: { kind: 'invitation', id: sent.body.id, label: newcomer.email },
        details: { role: 'owner' },
      });
      expect(await newest('sign-in.succeeded')).toMatchObject({ actor: { email: newcomer.email } });
    });

    it('records a device token made and revoked, never the token itself', async () => {
      const made = await call('technician', 'POST', `/api/tanks/${tank.id}/devices`, { name: 'Sump probe' });
      const revoked = await call(
        'technician',
        'DELETE',
        `/api/tanks/${tank.id}/devices/${made.body.device.id}`,
      );
      const created = await newest('device.created');

      expect(made.status).toBe(201);
      expect(revoked.status).toBe(200);
      expect(created).toMatchObject({
        actor: { id: people.technician.id },
        target: { kind: 'device', id: made.body.device.id, label: 'Sump probe (Lobby reef)' },
        details: { tank: 'Lobby reef', tokenHint: made.body.device.tokenHint },
      });
      expect(JSON.stringify(created)).not.toContain(made.body.token);
      expect(await newest('device.revoked')).toMatchObject({
        target: { kind: 'device', id: made.body.device.id },
      });
    });

    it('records limits and rate rules with what they were and what they became', async () => {
      const own = { warnLow: 24.5, warnHigh: 26.5, critLow: 23, critHigh: 28 };
      const set = await call('technician', 'PUT', `/api/tanks/${tank.id}/limits`, {
        limits: { temperature: own },
      });
      const setEntry = await newest('limits.changed');
      const rate = await call('technician', 'PUT', `/api/tanks/${tank.id}/limits`, {
        rates: { temperature: { maxChange: 1, perHours: 4 } },
      });
      const rateEntry = await newest('limits.changed');

      expect(set.status).toBe(200);
      expect(rate.status).toBe(200);
      expect(setEntry).toMatchObject({
        actor: { id: people.technician.id },
        target: { kind: 'tank', id: tank.id, label: 'Lobby reef' },
        before: { temperature: null },
        after: { temperature: { ...own, rate: null } },
      });
      expect(rateEntry).toMatchObject({
        before: { temperature: { ...own, rate: null } },
        after: { temperature: { ...own, rate: { maxChange: 1, perHours: 4 } } },
      });
    });

    it('records a readings download with its filters, and not one that was refused', async () => {
      const res = await call('owner', 'GET', `/api/tanks/${tank.id}/readings/export?parameter=temperature`);
      const entry = await newest('readings.exported');
      const refused = await call('otherAdmin', 'GET', `/api/tanks/${tank.id}/readings/export`);

      expect(res.status).toBe(200);
      expect(entry).toMatchObject({
        actor: { id: people.owner.id },
        target: { kind: 'tank', id: tank.id, label: 'Lobby reef' },
        details: { filters: { parameter: 'temperature' } },
        ip: clientIp,
      });
      expect(refused.status).toBe(404);
      expect((await newest('readings.exported'))!.id).toBe(entry!.id);
    });

    it('records a photo deleted', async () => {
      const png = await makeImage({ width: 64, height: 48, format: 'png' });
      const stored = await storePhotoObjects(stack.deps.storage, png, new Date());
      const [photo] = await stack.database.db
        .insert(photos)
        .values({
          companyId: company.id,
          tankId: tank.id,
          subject: 'tank',
          ...stored,
          caption: 'Left side',
          uploadedBy: people.technician.id,
        })
        .returning();

      const res = await call('technician', 'DELETE', `/api/photos/${photo!.id}`);

      expect(res.status).toBe(204);
      expect(await newest('photo.deleted')).toMatchObject({
        actor: { id: people.technician.id },
        target: { kind: 'photo', id: photo!.id, label: 'Left side (Lobby reef)' },
        details: { tank: 'Lobby reef' },
      });
    });
  });

  describe('GET /api/audit', () => {
    it('lists newest first and filters by action, person and target kind', async () => {
      const all = (await trail()).entries;
      const byAction = (await trail({ action: 'device.created' })).entries;
      const byActor = (await trail({ actor: 'ADA ADM' })).entries;
      const byKind = (await trail({ targetKind: 'tank' })).entries;

      const times = all.map((e) => Date.parse(e.at));
      expect(times).toEqual([...times].sort((a, b) => b - a));
      expect(byAction.length).toBeGreaterThan(0);
      expect(byAction.every((e) => e.action === 'device.created')).toBe(true);
      expect(byActor.length).toBeGreaterThan(0);
      expect(byActor.every((e) => e.actor?.id === people.admin.id)).toBe(true);
      expect(byKind.length).toBeGreaterThan(0);
      expect(byKind.every((e) => e.target?.kind === 'tank')).toBe(true);
    });

    it('treats the person filter as text, not a pattern', async () => {
      expect((await trail({ actor: '%' })).entries).toEqual([]);
    });

    it('filters by a stretch of time', async () => {
      const { db } = stack.database;
      const admin = { id: people.admin.id, name: 'Ada Admin', email: people.admin.email };
      for (const day of ['2025-01-10', '2025-02-10', '2025-03-10']) {
        await recordAudit(db, {
          companyId: company.id,
          actor: admin,
          action: 'user.reactivated',
          target: { kind: 'user', id: people.colleague.id, label: `dated ${day}` },
          source: noRequest(new Date(`${day}T12:00:00Z`)),
        });
      }

      const february = (await trail({ from: '2025-02-01T00:00:00Z', to: '2025-02-28T23:59:59Z' })).entries;
      const sinceMarch = (await trail({ from: '2025-03-01T00:00:00Z', action: 'user.reactivated' })).entries;

      expect(february.map((e) => e.target?.label)).toEqual(['dated 2025-02-10']);
      expect(sinceMarch.map((e) => e.target?.label)).toContain('dated 2025-03-10');
      expect(sinceMarch.map((e) => e.target?.label)).not.toContain('dated 2025-02-10');
    });

    it('pages by cursor without repeating or skipping an entry', async () => {
      const all = (await trail()).entries.map((e) => e.id);
      const seen: number[] = [];
      let before: string | null = null;
      do {
        const page: AuditPage = await trail({ limit: '3', ...(before ? { before } : {}) });
        expect(page.entries.length).toBeLessThanOrEqual(3);
        seen.push(...page.entries.map((e) => e.id));
        before = page.next;
      } while (before);

      expect(all.length).toBeGreaterThan(6);
      expect(seen).toEqual(all);
    });

    it('refuses a filter it does not know, naming it', async () => {
      const res = await call('admin', 'GET', '/api/audit?action=tank.painted&before=yesterday');

      expect(res.status).toBe(400);
      expect(res.body.error.issues.map((i: { path: string }) => i.path).sort()).toEqual([
        'query.action',
        'query.before',
      ]);
    });

    it('is for admins only: owners and technicians get 403, signed-out callers 401', async () => {
      for (const who of ['owner', 'technician'] as const) {
        expect((await call(who, 'GET', '/api/audit')).status).toBe(403);
        expect((await call(who, 'GET', '/api/audit/export')).status).toBe(403);
      }
      const signedOut = await new HttpBrowser().visit(`${stack.origin}/api/audit`);
      expect(signedOut.status).toBe(401);
    });

    it("shows another company's admin nothing of this company", async () => {
      const theirs = (await trail({}, 'otherAdmin')).entries;
      const mine = new Set((await trail()).entries.map((e) => e.id));

      expect(theirs.length).toBeGreaterThan(0);
      expect(theirs.every((e) => !mine.has(e.id))).toBe(true);
      expect(theirs.every((e) => e.actor?.id === people.otherAdmin.id)).toBe(true);
    });
  });

  describe('GET /api/audit/export', () => {
    it('downloads the filtered list as CSV, the same entries as the list', async () => {
      const listed = (await trail({ action: 'user.role-changed' })).entries;
      const res = await call('admin', 'GET', '/api/audit/export?action=user.role-changed');
      const lines = res.text.trimEnd().split('\r\n');

      expect(res.status).toBe(200);
      expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
      expect(res.headers.get('content-disposition')).toMatch(
        /^attachment; filename="audit-trail-\d{4}-\d\d-\d\d\.csv"$/,
      );
      expect(lines[0]).toBe(
        'at,action,actor_name,actor_email,target_kind,target_id,target_label,ip,user_agent,request_id,before,after,details',
      );
      expect(lines).toHaveLength(listed.length + 1);
      expect(lines[1]).toContain(listed[0]!.at);
      expect(lines[1]).toContain('user.role-changed,Ada Admin');
      expect(lines[1]).toContain('"{""role"":""technician""}"');
    });
  });

  describe('append-only', () => {
    it('refuses a plain UPDATE, DELETE or TRUNCATE of the trail', async () => {
      const { pool } = stack.database;
      const [row] = await stack.database.db.select().from(auditEvents).limit(1);

      await expect(
        pool.query(`update audit_events set actor_name = 'someone else' where id = $1`, [row!.id]),
      ).rejects.toThrow(/append-only: UPDATE refused/);
      await expect(pool.query('delete from audit_events where id = $1', [row!.id])).rejects.toThrow(
        /append-only: DELETE refused/,
      );
      await expect(pool.query('truncate audit_events')).rejects.toThrow(/append-only: TRUNCATE refused/);
      const [still] = await stack.database.db.select().from(auditEvents).where(eq(auditEvents.id, row!.id));
      expect(still).toEqual(row);
    });
  });

  describe('retention', () => {
    it('keeps AUDIT_RETENTION_DAYS (400 unless set) and refuses a value below one day', () => {
      const secrets = { OIDC_CLIENT_SECRET: 'c'.repeat(16), SESSION_SECRET: 's'.repeat(32) };
      expect(parseEnv(secrets).AUDIT_RETENTION_DAYS).toBe(400);
      expect(parseEnv({ ...secrets, AUDIT_RETENTION_DAYS: '30' }).AUDIT_RETENTION_DAYS).toBe(30);
      expect(() => parseEnv({ ...secrets, AUDIT_RETENTION_DAYS: '0' })).toThrow(/AUDIT_RETENTION_DAYS/);
    });

    it('purges entries older than the retention, keeps the rest, and leaves the trail append-only', async () => {
      const { db, pool } = stack.database;
      const now = stack.deps.clock();
      const ago = (n: number) => new Date(now.getTime() - days(n));
      const stamp = async (label: string, at: Date) =>
        recordAudit(db, {
          companyId: company.id,
          actor: null,
          action: 'device.revoked',
          target: { kind: 'device', id: label, label },
          source: noRequest(at),
        });
      await stamp('kept 399 days', ago(399));
      await stamp('gone 401 days', ago(401));
      await stamp('gone 30 days with a shorter retention', ago(30));
      const labels = async () =>
        (await db.select({ label: auditEvents.targetLabel }).from(auditEvents)).map((r) => r.label);
      const olderThan = async (n: number) =>
        (await db.select({ at: auditEvents.at }).from(auditEvents)).filter((r) => r.at < ago(n)).length;
      const expiredByDefault = await olderThan(400);

      const purgedDefault = await purgeExpiredAudit(stack.deps);
      const afterDefault = await labels();
      const purgedShort = await purgeExpiredAudit({
        ...stack.deps,
        env: { ...stack.deps.env, AUDIT_RETENTION_DAYS: 20 },
      });
      const afterShort = await labels();

      expect(stack.deps.env.AUDIT_RETENTION_DAYS).toBe(400);
      expect(expiredByDefault).toBeGreaterThanOrEqual(1);
      expect(purgedDefault).toBe(expiredByDefault);
      expect(afterDefault).not.toContain('gone 401 days');
      expect(afterDefault).toContain('kept 399 days');
      expect(afterDefault).toContain('gone 30 days with a shorter retention');
      expect(purgedShort).toBeGreaterThanOrEqual(2);
      expect(afterShort).not.toContain('gone 30 days with a shorter retention');
      expect(afterShort).not.toContain('kept 399 days');
      expect(afterShort).toContain(`Lobby reef`);
      await expect(pool.query('delete from audit_events')).rejects.toThrow(/append-only/);
    });
  });
});

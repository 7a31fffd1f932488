import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { encodeCursor } from '@shared/lists/cursor';
import type { TankOverviewPage } from '@shared/schemas/tanks';
import { alerts, tankStatuses, tanks } from '../../api/db/schema/index';
import { rejudgeStaleStatuses, statusRecheckMs } from '../../api/services/tank-status';
import { signedIn, type ApiSession } from '../helpers/api-session';
import { createCompany, createPerson, createTank } from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';

/**
 * The staff overview pages through a company's tanks worst first, then longest in that status,
 * from the stored statuses; every page is judged again live. 130 tanks make three pages of 50.
 */
describe('GET /api/tanks/overview', () => {
  let stack: TestStack;
  let technician: ApiSession;
  let owner: ApiSession;
  let otherAdmin: ApiSession;
  let technicianId: string;
  const byStatus = { alert: [] as string[], watch: [] as string[], 'no-data': [] as string[] };
  let otherTankId: string;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    const company = await createCompany(db);
    const other = await createCompany(db);
    const tech = await createPerson(db, {
      companyId: company.id,
      role: 'technician',
      issuer,
      name: 'Wren Tide',
    });
    technicianId = tech.id;
    const ownerPerson = await createPerson(db, { companyId: company.id, role: 'owner', issuer });
    const otherAdminPerson = await createPerson(db, { companyId: other.id, role: 'admin', issuer });
    otherTankId = (await createTank(db, { companyId: other.id, name: 'Elsewhere reef' })).id;

    const now = stack.clock.now();
    for (let i = 0; i < 130; i += 1) {
      const kind = i % 10 === 0 ? 'alert' : i % 5 === 0 ? 'watch' : 'no-data';
      const tank = await createTank(db, {
        companyId: company.id,
        name: `Tank ${String(i).padStart(3, '0')}`,
        style: i % 2 === 0 ? 'mixed-reef' : 'community-freshwater',
        waterType: i % 2 === 0 ? 'marine' : 'fresh',
        assignedTechnicianId: i < 20 ? tech.id : null,
        owners: i === 7 ? [ownerPerson] : [],
      });
      byStatus[kind].push(tank.id);
      if (kind === 'no-data') continue;
      await db.insert(alerts).values({
        companyId: company.id,
        tankId: tank.id,
        kind: 'limit',
        ruleKey: 'limit:temperature',
        parameter: 'temperature',
        severity: kind === 'alert' ? 'critical' : 'warning',
        title: `Temperature out of range in Tank ${i}`,
        body: 'Temperature is outside its limits.',
        value: 30.2,
        limitValue: 29,
        direction: 'high',
        openedAt: now,
        lastSeenAt: now,
      });
    }
    technician = await signedIn(stack, tech);
    owner = await signedIn(stack, ownerPerson);
    otherAdmin = await signedIn(stack, otherAdminPerson);
  });
  afterAll(() => stack.close());

  async function everyPage(query: string) {
    const pages: TankOverviewPage[] = [];
    let after: string | null = null;
    do {
      const res: { status: number; body: TankOverviewPage } = await technician.get<TankOverviewPage>(
        `/api/tanks/overview?${query}${after ? `&after=${after}` : ''}`,
      );
      expect(res.status).toBe(200);
      pages.push(res.body);
      after = res.body.next;
    } while (after && pages.length < 10);
    return pages;
  }

  it('lists every tank exactly once across its pages, worst first, 50 a page', async () => {
    const pages = await everyPage('');
    expect(pages.map((page) => page.tanks.length)).toEqual([50, 50, 30]);
    expect(pages.at(-1)!.next).toBeNull();
    const ids = pages.flatMap((page) => page.tanks.map((tank) => tank.id));
    expect(new Set(ids).size).toBe(130);
    const statuses = pages.flatMap((page) => page.tanks.map((tank) => tank.status));
    expect(statuses.slice(0, 13)).toEqual(Array(13).fill('alert'));
    expect(statuses.slice(13, 26)).toEqual(Array(13).fill('watch'));
    expect(statuses.slice(26)).toEqual(Array(104).fill('no-data'));
    expect(ids).not.toContain(otherTankId);
    expect(pages[0]!.counts).toEqual({ alert: 13, watch: 13, 'no-data': 104, healthy: 0 });
  });

  it('puts the tank longest in its status first within a status', async () => {
    const { db } = stack.database;
    const [first, second] = byStatus.watch;
    // The second watch tank has been in trouble for a day longer than every other.
    const dayEarlier = new Date(stack.clock.now().getTime() - 24 * 3_600_000);
    await db.update(tankStatuses).set({ since: dayEarlier }).where(eq(tankStatuses.tankId, second!));
    const [page] = await everyPage('status=watch');
    expect(page!.tanks[0]!.id).toBe(second);
    expect(page!.tanks.map((tank) => tank.id)).toContain(first);
  });

  it('filters by status, technician, style and words, and counts under the other filters', async () => {
    const alertsOnly = (await everyPage('status=alert')).flatMap((page) => page.tanks);
    expect(alertsOnly.map((tank) => tank.id).sort()).toEqual([...byStatus.alert].sort());

    const mine = (await everyPage(`technicianId=${technicianId}`)).flatMap((page) => page.tanks);
    expect(mine).toHaveLength(20);
    expect(mine.every((tank) => tank.assignedTechnician?.id === technicianId)).toBe(true);

    const freshPages = await everyPage('style=community-freshwater&status=no-data,watch');
    const fresh = freshPages.flatMap((page) => page.tanks);
    expect(fresh.every((tank) => tank.style === 'community-freshwater')).toBe(true);
    expect(fresh.every((tank) => tank.status !== 'alert')).toBe(true);
    // Odd-numbered tanks are freshwater: the odd multiples of 5 (5, 15, … 125) are on watch.
    expect(fresh).toHaveLength(65);
    expect(freshPages[0]!.counts).toEqual({ alert: 0, watch: 13, 'no-data': 52, healthy: 0 });

    const named = (await everyPage('q=Tank%20012')).flatMap((page) => page.tanks);
    expect(named.map((tank) => tank.name)).toEqual(['Tank 012']);
  });

  it('shows a status changed since it was stored as it is now, and stores it', async () => {
    const { db } = stack.database;
    const resolvedTank = byStatus.alert[0]!;
    await db
      .update(alerts)
      .set({ status: 'resolved', resolvedAt: stack.clock.now() })
      .where(eq(alerts.tankId, resolvedTank));
    const [page] = await everyPage('status=alert');
    const row = page!.tanks.find((tank) => tank.id === resolvedTank);
    expect(row?.status).toBe('no-data');
    const [stored] = await db.select().from(tankStatuses).where(eq(tankStatuses.tankId, resolvedTank));
    expect(stored).toMatchObject({ status: 'no-data', rank: 2 });
  });

  it('judges stored statuses again once they are older than the recheck period', async () => {
    const { db } = stack.database;
    // Every tank of this file's database, stored or never judged (the other company's).
    const everyTank = await db.select({ id: tanks.id }).from(tanks);
    stack.clock.advance(statusRecheckMs + 1_000);
    const at = stack.clock.now();
    const judged = await rejudgeStaleStatuses(db, at);
    stack.clock.reset();
    expect(judged).toBe(Math.min(everyTank.length, 500));
    const after = await db.select().from(tankStatuses);
    const fresh = after.filter((row) => row.judgedAt.getTime() === at.getTime());
    expect(fresh.length).toBe(judged);
  });

  it('refuses owners, keeps other companies out, and refuses a cursor it did not make', async () => {
    expect((await owner.get('/api/tanks/overview')).status).toBe(403);
    const foreign = await otherAdmin.get<TankOverviewPage>('/api/tanks/overview');
    expect(foreign.status).toBe(200);
    expect(foreign.body.tanks.map((tank) => tank.id)).toEqual([otherTankId]);

    const forged = encodeCursor(['9', 'yesterday', 'nobody']);
    for (const after of [forged, 'not base64 at all!', 'Zm9v']) {
      const res = await technician.get<{ error: { code: string; message: string } }>(
        `/api/tanks/overview?after=${encodeURIComponent(after)}`,
      );
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('invalid_request');
    }
    const badStatus = await technician.get<{ error: { code: string } }>(
      '/api/tanks/overview?status=drowning',
    );
    expect(badStatus.status).toBe(400);
  });
});

import { eq } from 'drizzle-orm';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { deliveries, notifications, onCallShifts, tanks } from '../../api/db/schema/index';
import { afterAlertEvents } from '../../api/services/alerts';
import { evaluateNewReadings } from '../../api/services/alert-engine';
import { hours, minutes } from '../helpers/clock';
import {
  createCompany,
  createPerson,
  createTank,
  insertReadings,
  type TestPerson,
} from '../helpers/factories';
import { HttpBrowser } from '../helpers/http-browser';
import { signIn, startTestStack, type TestStack } from '../helpers/stack';

/** Who is told about an alert, and on which channel (mixed-reef template: warning above 27.5 °C, critical above 29 °C). */
describe('alert recipients and preferences', () => {
  let stack: TestStack;
  let owner: TestPerson;
  let technician: TestPerson;
  let onCall: TestPerson;
  let bystander: TestPerson;
  let tank: { id: string; companyId: string };
  let ownerBrowser: HttpBrowser;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const company = await createCompany(db);
    const issuer = stack.idp.issuer;
    owner = await createPerson(db, { companyId: company.id, role: 'owner', issuer });
    technician = await createPerson(db, { companyId: company.id, role: 'technician', issuer });
    onCall = await createPerson(db, { companyId: company.id, role: 'technician', issuer });
    bystander = await createPerson(db, { companyId: company.id, role: 'technician', issuer });
    tank = await createTank(db, { companyId: company.id, name: 'Bistro reef', owners: [owner] });
    await db.update(tanks).set({ assignedTechnicianId: technician.id }).where(eq(tanks.id, tank.id));
    const now = Date.now();
    await db.insert(onCallShifts).values({
      companyId: company.id,
      userId: onCall.id,
      startsAt: new Date(now - hours(1)),
      endsAt: new Date(now + hours(8)),
    });
    ownerBrowser = new HttpBrowser();
    await signIn(stack, ownerBrowser, owner);
  });
  afterAll(() => stack.close());
  afterEach(async () => {
    await stack.database.pool.query(
      'delete from alerts; delete from alert_rule_states; delete from readings',
    );
  });

  async function reading(value: number) {
    const stored = await insertReadings(stack.database.db, tank, [
      { parameter: 'temperature', value, measuredAt: new Date(Date.now() - minutes(5)), source: 'home-test' },
    ]);
    await afterAlertEvents(stack.deps, await evaluateNewReadings(stack.database.db, tank.id, stored));
  }

  const notifiedUsers = async () =>
    new Set(
      (await stack.database.db.select({ userId: notifications.userId }).from(notifications)).map(
        (r) => r.userId,
      ),
    );

  async function setOwnerPreferences(body: Record<string, unknown>) {
    const res = await ownerBrowser.visit(`${stack.origin}/api/notifications/preferences`, {
      method: 'PUT',
      headers: { ...stack.sameOrigin, 'content-type': 'application/json' },
      body: JSON.stringify(body),
    });
    expect(res.status).toBe(200);
  }

  it('tells the owners and the assigned technician about a warning, not the on-call technician', async () => {
    await reading(28);
    const told = await notifiedUsers();
    expect(told.has(owner.id)).toBe(true);
    expect(told.has(technician.id)).toBe(true);
    expect(told.has(onCall.id)).toBe(false);
    expect(told.has(bystander.id)).toBe(false);
  });

  it('adds whoever is on call for a critical alert', async () => {
    await reading(30);
    const told = await notifiedUsers();
    expect(told.has(onCall.id)).toBe(true);
    expect(told.has(bystander.id)).toBe(false);
  });

  it('holds e-mail back in quiet hours for a warning, but lets a critical alert through', async () => {
    // Quiet all day except one minute: whatever the time now, it is quiet.
    const now = new Date();
    const pad = (n: number) => String(n).padStart(2, '0');
    const end = `${pad(now.getUTCHours())}:${pad((now.getUTCMinutes() + 59) % 60)}`;
    const start = `${pad(now.getUTCHours())}:${pad(now.getUTCMinutes())}`;
    await setOwnerPreferences({
      push: [],
      email: ['warning', 'critical'],
      inApp: ['notice', 'warning', 'critical'],
      quietHours: start < end ? { start, end } : { start: '00:00', end: '23:59' },
      timeZone: 'UTC',
    });

    await reading(28);
    const afterWarning = await stack.database.db
      .select()
      .from(deliveries)
      .where(eq(deliveries.userId, owner.id));
    await reading(30);
    const afterCritical = await stack.database.db
      .select()
      .from(deliveries)
      .where(eq(deliveries.userId, owner.id));

    expect(afterWarning.filter((d) => d.channel === 'email')).toHaveLength(0);
    expect(afterCritical.filter((d) => d.channel === 'email')).toHaveLength(1);
  });

  it('refuses preferences that do not validate, naming the field', async () => {
    const res = await ownerBrowser.visit(`${stack.origin}/api/notifications/preferences`, {
      method: 'PUT',
      headers: { ...stack.sameOrigin, 'content-type': 'application/json' },
      body: JSON.stringify({
        push: ['loud'],
        email: [],
        inApp: [],
        quietHours: { start: '25:00', end: '07:00' },
        timeZone: 'UTC',
      }),
    });
    const body = (await res.json()) as { error: { issues: { path: string }[] } };
    expect(res.status).toBe(400);
    expect(body.error.issues.map((i) => i.path)).toEqual(
      expect.arrayContaining(['body.push.0', 'body.quietHours.start']),
    );
  });
});

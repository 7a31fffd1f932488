import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { notificationPreferences, notifications, tanks, users } from '../../api/db/schema/index';
import { createLogger } from '../../api/lib/logger';
import { afterAlertEvents } from '../../api/services/alerts';
import { evaluateNewReadings } from '../../api/services/alert-engine';
import { minutes } from '../helpers/clock';
import {
  createCompany,
  createPerson,
  createTank,
  insertReadings,
  type TestPerson,
} from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';

/** One person's broken settings must not silence an alert for anyone (mixed-reef: warning above 27.5 °C). */
describe('alert fan-out with unusable preferences', () => {
  let stack: TestStack;
  let brokenZone: TestPerson;
  let brokenProfileZone: TestPerson;
  let coOwner: TestPerson;
  let technician: TestPerson;
  let tank: { id: string; companyId: string };
  const logLines: Array<{ level: number; msg: string; userId?: string }> = [];

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const company = await createCompany(db);
    const issuer = stack.idp.issuer;
    brokenZone = await createPerson(db, { companyId: company.id, role: 'owner', issuer });
    brokenProfileZone = await createPerson(db, { companyId: company.id, role: 'owner', issuer });
    coOwner = await createPerson(db, { companyId: company.id, role: 'owner', issuer });
    technician = await createPerson(db, { companyId: company.id, role: 'technician', issuer });
    tank = await createTank(db, {
      companyId: company.id,
      name: 'Lobby reef',
      owners: [brokenZone, brokenProfileZone, coOwner],
    });
    await db.update(tanks).set({ assignedTechnicianId: technician.id }).where(eq(tanks.id, tank.id));
    // Written straight into the database, as rows saved before zones were checked could be.
    await db.insert(notificationPreferences).values({
      userId: brokenZone.id,
      preferences: {
        push: [],
        email: [],
        inApp: ['warning', 'critical'],
        quietHours: { start: '22:00', end: '07:00' },
        timeZone: 'Mars/Olympus_Mons',
      },
    });
    await db.update(users).set({ timeZone: 'Atlantis/Capital' }).where(eq(users.id, brokenProfileZone.id));
  });
  afterAll(() => stack.close());

  it('tells every recipient, the one with the unknown zone included, and logs the problem at warn', async () => {
    const logger = createLogger('warn', { write: (line: string) => void logLines.push(JSON.parse(line)) });
    const deps = { ...stack.deps, logger };
    const stored = await insertReadings(stack.database.db, tank, [
      {
        parameter: 'temperature',
        value: 28,
        measuredAt: new Date(Date.now() - minutes(5)),
        source: 'home-test',
      },
    ]);

    await afterAlertEvents(deps, await evaluateNewReadings(stack.database.db, tank.id, stored));

    const told = new Set(
      (await stack.database.db.select({ userId: notifications.userId }).from(notifications)).map(
        (r) => r.userId,
      ),
    );
    expect([...told].sort()).toEqual([brokenZone.id, brokenProfileZone.id, coOwner.id, technician.id].sort());
    const warned = logLines.filter((line) => line.level === 40).map((line) => line.userId);
    expect(warned).toEqual(expect.arrayContaining([brokenZone.id, brokenProfileZone.id]));
    expect(warned).not.toContain(coOwner.id);
  });
});

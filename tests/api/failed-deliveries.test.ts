import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DeliveryView } from '@shared/schemas/on-call';
import { visitReportContent } from '@shared/schemas/visits';
import {
  alertEvents,
  alerts,
  careTips,
  conversationMessages,
  conversations,
  deliveries,
  urgentRequestEvents,
  urgentRequests,
  visits,
} from '../../api/db/schema/index';
import { signedIn, type ApiSession } from '../helpers/api-session';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';

type Subject =
  | { alertEventId: string }
  | { visitId: string }
  | { tipId: string }
  | { messageId: string }
  | { urgentEventId: string };

/**
 * The staff list of notifications that could not be delivered covers every kind of subject a
 * delivery tells of. Subjects and deliveries are written as the notification paths leave them;
 * that a delivery out of retries ends up failed is tested in tests/api/alert-delivery.test.ts.
 */
describe('GET /api/deliveries/failed', () => {
  let stack: TestStack;
  /** The words of an internal note a failed delivery tells of: never part of the list. */
  const noteMarker = `NOTE-${randomUUID()}`;
  const minutesAgo = (minutes: number) => new Date(Date.now() - minutes * 60_000);

  async function failedDelivery(
    subject: Subject,
    recipient: TestPerson,
    createdAt: Date,
    options: Partial<typeof deliveries.$inferInsert> = {},
  ) {
    const [row] = await stack.database.db
      .insert(deliveries)
      .values({
        ...subject,
        userId: recipient.id,
        channel: 'push',
        destination: `https://push.example.test/${randomUUID()}`,
        status: 'failed',
        attempts: 5,
        lastError: 'push service answered 500',
        createdAt,
        ...options,
      })
      .returning();
    return row!;
  }

  /** A company with one subject of each kind, about one tank (the tip goes to all its tanks). */
  async function companyWithSubjects(label: string) {
    const { db } = stack.database;
    const company = await createCompany(db);
    const owner = await createPerson(db, { companyId: company.id, role: 'owner', issuer: stack.idp.issuer });
    const technician = await createPerson(db, {
      companyId: company.id,
      role: 'technician',
      issuer: stack.idp.issuer,
    });
    const admin = await createPerson(db, { companyId: company.id, role: 'admin', issuer: stack.idp.issuer });
    const tank = await createTank(db, { companyId: company.id, name: `${label} reef`, owners: [owner] });
    const now = new Date();

    const [alert] = await db
      .insert(alerts)
      .values({
        companyId: company.id,
        tankId: tank.id,
        kind: 'limit',
        ruleKey: 'limit:temperature',
        parameter: 'temperature',
        severity: 'critical',
        title: `Temperature too high in ${label} reef`,
        body: 'Temperature is above the critical limit.',
        value: 30.2,
        limitValue: 29,
        direction: 'high',
        openedAt: now,
        lastSeenAt: now,
      })
      .returning();
    const [alertEvent] = await db
      .insert(alertEvents)
      .values({
        alertId: alert!.id,
        type: 'opened',
        severity: 'critical',
        value: 30.2,
        at: now,
        fannedOutAt: now,
      })
      .returning();

    const report = visitReportContent.parse({
      arrivedAt: minutesAgo(120).toISOString(),
      notes: 'Cleaned the glass and the overflow.',
    });
    const [visit] = await db
      .insert(visits)
      .values({
        companyId: company.id,
        tankId: tank.id,
        technicianId: technician.id,
        kind: 'routine',
        status: 'published',
        windowStart: minutesAgo(120),
        windowEnd: minutesAgo(60),
        draft: report,
        version: 1,
        published: report,
        publishedVersion: 1,
        publishedAt: minutesAgo(60),
        publishedBy: technician.id,
        announcedAt: minutesAgo(60),
        createdBy: technician.id,
      })
      .returning();

    const [tip] = await db
      .insert(careTips)
      .values({
        companyId: company.id,
        title: `Top up with fresh water (${label})`,
        body: 'Salt stays behind when water evaporates.',
        category: 'maintenance',
        audience: { kind: 'all' },
        status: 'sent',
        sentAt: now,
        createdBy: admin.id,
      })
      .returning();

    const [conversation] = await db
      .insert(conversations)
      .values({ companyId: company.id, tankId: tank.id, lastActivityAt: now })
      .returning();
    const [note] = await db
      .insert(conversationMessages)
      .values({
        conversationId: conversation!.id,
        companyId: company.id,
        tankId: tank.id,
        kind: 'internal-note',
        side: 'staff',
        authorId: admin.id,
        authorName: admin.name,
        body: `${noteMarker} The owner has not paid the last two visits.`,
      })
      .returning();

    const [request] = await db
      .insert(urgentRequests)
      .values({
        companyId: company.id,
        tankId: tank.id,
        requestedBy: owner.id,
        requestedByName: owner.name,
        category: 'leak',
        description: 'Water on the floor under the cabinet.',
        someoneOnSite: true,
        phone: '+44 20 7946 0958',
        snapshot: { readings: [], openAlerts: [] },
      })
      .returning();
    const [urgentEvent] = await db
      .insert(urgentRequestEvents)
      .values({
        requestId: request!.id,
        type: 'requested',
        actorId: owner.id,
        actorName: owner.name,
        at: now,
        fannedOutAt: now,
      })
      .returning();

    return {
      owner,
      technician,
      admin,
      tank,
      tip: tip!,
      visit: visit!,
      request: request!,
      subjects: {
        alert: { alertEventId: alertEvent!.id },
        visit: { visitId: visit!.id },
        tip: { tipId: tip!.id },
        message: { messageId: note!.id },
        urgent: { urgentEventId: urgentEvent!.id },
      },
    };
  }

  let first: Awaited<ReturnType<typeof companyWithSubjects>>;
  let second: Awaited<ReturnType<typeof companyWithSubjects>>;
  /** Company 1's failed deliveries, newest first, as the list must show them. */
  let expected: DeliveryView[];
  let secondIds: string[];
  let notFailedIds: string[];
  let firstStaff: ApiSession;
  let secondAdmin: ApiSession;

  beforeAll(async () => {
    stack = await startTestStack();
    first = await companyWithSubjects('Harbour');
    second = await companyWithSubjects('Orchard');

    // Company 2's failed deliveries fall between company 1's, so one that leaked would show.
    const alert = await failedDelivery(first.subjects.alert, first.owner, minutesAgo(50), {
      channel: 'email',
      destination: first.owner.email,
      lastError: 'mail server refused the recipient',
    });
    const visit = await failedDelivery(first.subjects.visit, first.owner, minutesAgo(40));
    const tip = await failedDelivery(first.subjects.tip, first.owner, minutesAgo(30));
    const message = await failedDelivery(first.subjects.message, first.technician, minutesAgo(20));
    const urgent = await failedDelivery(first.subjects.urgent, first.technician, minutesAgo(10), {
      attempts: 1,
      lastError: 'push subscription refused (403)',
    });
    secondIds = [];
    for (const [index, subject] of Object.values(second.subjects).entries()) {
      secondIds.push((await failedDelivery(subject, second.technician, minutesAgo(45 - index * 10))).id);
    }
    // Delivered, or still being retried: nothing to follow up.
    notFailedIds = [
      (await failedDelivery(first.subjects.urgent, first.admin, minutesAgo(1), { status: 'sent' })).id,
      (await failedDelivery(first.subjects.message, first.owner, minutesAgo(2), { status: 'pending' })).id,
      (await failedDelivery(first.subjects.alert, first.technician, minutesAgo(3), { status: 'gone' })).id,
    ];

    const common = (row: typeof alert) => ({
      id: row.id,
      channel: row.channel,
      status: 'failed' as const,
      attempts: row.attempts,
      lastError: row.lastError,
      createdAt: row.createdAt.toISOString(),
    });
    expected = [
      {
        ...common(urgent),
        recipient: first.technician.name,
        kind: 'urgent',
        about: 'Urgent visit request: Water leak or flood',
        tankName: 'Harbour reef',
        link: `/urgent/${first.request.id}`,
      },
      {
        ...common(message),
        recipient: first.technician.name,
        kind: 'message',
        about: 'Message',
        tankName: 'Harbour reef',
        link: `/tanks/${first.tank.id}/messages`,
      },
      {
        ...common(tip),
        recipient: first.owner.name,
        kind: 'tip',
        about: 'Care tip: Top up with fresh water (Harbour)',
        tankName: null,
        link: `/console/tips/${first.tip.id}`,
      },
      {
        ...common(visit),
        recipient: first.owner.name,
        kind: 'visit',
        about: 'Visit report',
        tankName: 'Harbour reef',
        link: `/visits/${first.visit.id}`,
      },
      {
        ...common(alert),
        recipient: first.owner.name,
        kind: 'alert',
        about: 'Alert: Temperature too high in Harbour reef',
        tankName: 'Harbour reef',
        link: `/tanks/${first.tank.id}`,
      },
    ];

    firstStaff = await signedIn(stack, first.technician);
    secondAdmin = await signedIn(stack, second.admin);
  });
  afterAll(() => stack?.close());

  it('lists one failed delivery of each kind, newest first, naming and linking its subject', async () => {
    const answer = await firstStaff.get<DeliveryView[]>('/api/deliveries/failed');
    expect(answer.status).toBe(200);
    expect(answer.body).toEqual(expected);
  });

  it('leaves out deliveries that were sent, are still pending or whose subscription is gone', async () => {
    const ids = (await firstStaff.get<DeliveryView[]>('/api/deliveries/failed')).body.map((d) => d.id);
    for (const id of notFailedIds) expect(ids).not.toContain(id);
  });

  it("never lists another company's failed deliveries, of any kind", async () => {
    const firstIds = (await firstStaff.get<DeliveryView[]>('/api/deliveries/failed')).body.map((d) => d.id);
    for (const id of secondIds) expect(firstIds).not.toContain(id);

    const seenBySecond = await secondAdmin.get<DeliveryView[]>('/api/deliveries/failed');
    expect(seenBySecond.status).toBe(200);
    expect(seenBySecond.body.map((d) => d.id)).toEqual([...secondIds].reverse());
    expect(seenBySecond.body.map((d) => d.kind)).toEqual(['urgent', 'message', 'tip', 'visit', 'alert']);
    for (const { id } of expected) expect(seenBySecond.body.map((d) => d.id)).not.toContain(id);
    expect(seenBySecond.bytes.toString('utf8')).not.toContain(first.tank.id);
  });

  it('names a message without quoting it, since it may be an internal note', async () => {
    for (const session of [firstStaff, secondAdmin]) {
      const answer = await session.get('/api/deliveries/failed');
      expect(answer.status).toBe(200);
      expect(answer.bytes.toString('utf8')).not.toContain(noteMarker);
    }
  });

  it('refuses owners (403)', async () => {
    const owner = await signedIn(stack, first.owner);
    const answer = await owner.get('/api/deliveries/failed');
    expect(answer.status).toBe(403);
    expect(answer.body).toMatchObject({ error: { code: expect.any(String) } });
  });

  it('lists the newest 100 at most', async () => {
    const { db } = stack.database;
    const busy = await companyWithSubjects('Quay');
    const rows = Array.from({ length: 101 }, (_, index) => ({
      ...busy.subjects.alert,
      userId: busy.owner.id,
      channel: 'push' as const,
      destination: `https://push.example.test/${randomUUID()}`,
      status: 'failed' as const,
      attempts: 5,
      createdAt: minutesAgo(200 - index),
    }));
    const inserted = await db.insert(deliveries).values(rows).returning({ id: deliveries.id });
    const staff = await signedIn(stack, busy.technician);
    const listed = (await staff.get<DeliveryView[]>('/api/deliveries/failed')).body.map((d) => d.id);
    expect(listed).toEqual(
      inserted
        .slice(1)
        .map((row) => row.id)
        .reverse(),
    );
  });
});

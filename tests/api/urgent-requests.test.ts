import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { TZDate } from '@date-fns/tz';
import { and, asc, eq, inArray } from 'drizzle-orm';
import webpush from 'web-push';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { defaultNotificationPreferences } from '@shared/schemas/notifications';
import {
  urgentRequestInput,
  type UrgentRequestView,
  type UrgentSettingsView,
} from '@shared/schemas/urgent-requests';
import type { VisitDetail } from '@shared/schemas/visits';
import { formatDateTime } from '@shared/text/dates';
import { defaultFirstAid } from '@shared/urgent/categories';
import {
  canMove,
  urgentStatuses,
  urgentStatusNames,
  urgentTransitions,
  type UrgentStatus,
} from '@shared/urgent/lifecycle';
import type { RunningPushService } from '../../api/dev/push-service';
import {
  alerts,
  auditEvents,
  billingSettings,
  deliveries,
  notificationPreferences,
  notifications,
  photos,
  type tanks,
  urgentRequestEvents,
  urgentRequests,
  urgentSettings,
  users,
} from '../../api/db/schema/index';
import { findActiveActor } from '../../api/services/actors';
import { deliverEmailJob, deliverPushJob } from '../../api/services/deliver';
import { createUrgentRequest } from '../../api/services/urgent-requests';
import {
  escalateOverdueRequests,
  fanOutUrgentEvent,
  unannouncedUrgentEvents,
} from '../../api/services/urgent-notify';
import { issuePaths, signedIn, type ApiSession } from '../helpers/api-session';
import { minutes } from '../helpers/clock';
import {
  addEquipmentTo,
  createCompany,
  createPerson,
  createTank,
  insertReadings,
  type TestPerson,
} from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';
import { startTestPushService } from './push/push-test-kit';

type Tank = typeof tanks.$inferSelect;
type ErrorBody = { error: { code: string; message: string; issues?: { path: string; message: string }[] } };
type View = UrgentRequestView & ErrorBody;

const london = 'Europe/London';
const moveTargets = urgentStatuses.filter((status) => status !== 'requested');
const inMinutes = (n: number) => new Date(Date.now() + n * 60_000).toISOString();

describe('urgent visit requests', () => {
  let stack: TestStack;
  let push: RunningPushService;
  let pushDir: string;
  let companyId: string;
  let people: Record<'ada' | 'abe' | 'tess' | 'theo' | 'olive' | 'colin' | 'nina', TestPerson>;
  let ada: ApiSession;
  let abe: ApiSession;
  let tess: ApiSession;
  let theo: ApiSession;
  let olive: ApiSession;
  let colin: ApiSession;
  let nina: ApiSession;
  let otherAdmin: ApiSession;
  let deactivatedId: string;
  let otherTechnicianId: string;
  let reef: Tank;
  let neighbour: Tank;
  let foreignTank: Tank;

  beforeAll(async () => {
    // The real push stand-in, without the job queue: each delivery is sent by the test itself.
    push = await startTestPushService();
    pushDir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-urgent-'));
    const caFile = path.join(pushDir, 'push-ca.pem');
    writeFileSync(caFile, push.caCertPem);
    const vapid = webpush.generateVAPIDKeys();
    stack = await startTestStack({
      env: {
        VAPID_PUBLIC_KEY: vapid.publicKey,
        VAPID_PRIVATE_KEY: vapid.privateKey,
        PUSH_TRUSTED_CA_FILE: caFile,
      },
    });
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    companyId = (await createCompany(db, { timeZone: london })).id;
    const otherCompanyId = (await createCompany(db)).id;
    const person = (role: TestPerson['role'], name: string) =>
      createPerson(db, { companyId, role, issuer, name });
    people = {
      ada: await person('admin', 'Ada Admin'),
      abe: await person('admin', 'Abe Admin'),
      tess: await person('technician', 'Tess Tech'),
      theo: await person('technician', 'Theo Tech'),
      olive: await person('owner', 'Olive Owner'),
      colin: await person('owner', 'Colin Co-owner'),
      nina: await person('owner', 'Nina Neighbour'),
    };
    deactivatedId = (await person('technician', 'Dee Parted')).id;
    await db.update(users).set({ status: 'deactivated' }).where(eq(users.id, deactivatedId));
    otherTechnicianId = (
      await createPerson(db, {
        companyId: otherCompanyId,
        role: 'technician',
        issuer,
        name: 'Elsewhere Tech',
      })
    ).id;
    ada = await signedIn(stack, people.ada);
    abe = await signedIn(stack, people.abe);
    tess = await signedIn(stack, people.tess);
    theo = await signedIn(stack, people.theo);
    olive = await signedIn(stack, people.olive);
    colin = await signedIn(stack, people.colin);
    nina = await signedIn(stack, people.nina);
    otherAdmin = await signedIn(
      stack,
      await createPerson(db, { companyId: otherCompanyId, role: 'admin', issuer, name: 'Other Admin' }),
    );
    reef = await createTank(db, {
      companyId,
      name: 'Lobby reef',
      style: 'mixed-reef',
      timeZone: london,
      setUpOn: '2020-01-01',
      owners: [people.olive, people.colin],
    });
    neighbour = await createTank(db, { companyId, name: 'Next door', owners: [people.nina] });
    foreignTank = await createTank(db, { companyId: otherCompanyId, name: 'Elsewhere' });
  });
  afterAll(async () => {
    await stack.close();
    await push.close();
    rmSync(pushDir, { recursive: true, force: true });
  });
  beforeEach(async () => {
    await refillBudgets();
    stack.clock.reset();
    push.clear();
    stack.mail.clear();
  });
  afterEach(async () => {
    stack.clock.reset();
    const { db } = stack.database;
    await db.delete(urgentSettings).where(eq(urgentSettings.companyId, companyId));
    await db.delete(billingSettings).where(eq(billingSettings.companyId, companyId));
    await stack.database.pool.query('delete from on_call_shifts');
  });

  /** The call-out fee lives on the company's price list (billing settings), typed in the major unit. */
  async function setCallOutFee(callOutFee: string | null, currency = 'GBP') {
    const res = await ada.put<ErrorBody>('/api/billing/settings', {
      currency,
      taxRate: '20',
      taxLabel: 'VAT',
      pricesIncludeTax: true,
      paymentTermsDays: 14,
      hourlyRate: null,
      callOutFee,
      sellerName: '',
      sellerAddress: '',
      sellerTaxId: '',
      invoiceFooter: '',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  }

  /** The per-tank budget of 5 an hour, spent again from zero (only the rate-limit test spends it up). */
  const refillBudgets = () =>
    stack.database.pool.query(`delete from rate_limits where key like 'urgent-request:%'`);

  const validRequest = (fields: Record<string, unknown> = {}) => ({
    category: 'leak',
    description: 'Water is dripping from the sump onto the floor.',
    someoneOnSite: true,
    access: 'Reception has a key.',
    phone: '+44 20 7946 0958',
    bestTime: 'Any time',
    acceptedCallOutFeeCents: null,
    ...fields,
  });
  const ask = (who: ApiSession, tank: { id: string }, fields: Record<string, unknown> = {}) =>
    who.post<View>(`/api/tanks/${tank.id}/urgent-requests`, validRequest(fields));
  async function asked(who: ApiSession = olive, tank: { id: string } = reef, fields = {}) {
    const res = await ask(who, tank, fields);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body;
  }
  const move = (who: ApiSession, id: string, body: Record<string, unknown>) =>
    who.post<View>(`/api/urgent-requests/${id}/moves`, body);
  async function moved(who: ApiSession, id: string, body: Record<string, unknown>) {
    const res = await move(who, id, body);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body;
  }
  const getRequest = (who: ApiSession, id: string) => who.get<View>(`/api/urgent-requests/${id}`);

  /** A valid body for each move, so a refusal speaks of the lifecycle only. */
  const bodyFor = (to: UrgentStatus): Record<string, unknown> =>
    ({
      requested: { to },
      acknowledged: { to, eta: inMinutes(40) },
      assigned: { to, technicianId: people.tess.id },
      'on-the-way': { to },
      'on-site': { to },
      resolved: { to, note: 'Replaced the heater.' },
      declined: {
        to,
        reason: 'Both technicians are at other emergencies.',
        advice: 'Keep the return pump off and the lid on; we call you at 08:00.',
      },
    })[to];

  /** A request written straight into the table in any status (the lifecycle is tested on top of it). */
  async function requestIn(status: UrgentStatus, tank: Tank = reef) {
    const assigned = ['assigned', 'on-the-way', 'on-site', 'resolved'].includes(status);
    const [row] = await stack.database.db
      .insert(urgentRequests)
      .values({
        companyId,
        tankId: tank.id,
        requestedBy: people.olive.id,
        requestedByName: 'Olive Owner',
        category: 'temperature',
        description: 'The water is cold.',
        someoneOnSite: true,
        phone: '+44 20 7946 0958',
        status,
        eta: status === 'requested' ? null : new Date(Date.now() + 30 * 60_000),
        technicianId: assigned ? people.tess.id : null,
        snapshot: { readings: [], openAlerts: [] },
        closedAt: status === 'resolved' || status === 'declined' ? new Date() : null,
      })
      .returning();
    return row!;
  }

  const eventsOf = (requestId: string) =>
    stack.database.db
      .select()
      .from(urgentRequestEvents)
      .where(eq(urgentRequestEvents.requestId, requestId))
      .orderBy(asc(urgentRequestEvents.at), asc(urgentRequestEvents.createdAt));
  const rowOf = async (requestId: string) =>
    (await stack.database.db.select().from(urgentRequests).where(eq(urgentRequests.id, requestId)))[0]!;
  const notificationsFor = (eventId: string) =>
    stack.database.db.select().from(notifications).where(eq(notifications.urgentEventId, eventId));
  const deliveriesFor = (eventId: string) =>
    stack.database.db.select().from(deliveries).where(eq(deliveries.urgentEventId, eventId));

  const onCall = (who: TestPerson, startsAt: Date, endsAt: Date) =>
    ada.post('/api/on-call', {
      userId: who.id,
      startsAt: startsAt.toISOString(),
      endsAt: endsAt.toISOString(),
    });

  async function subscribeToPush(who: ApiSession) {
    const subscription = await push.createSubscription();
    const res = await who.post('/api/push/subscriptions', {
      endpoint: subscription.endpoint,
      keys: subscription.keys,
    });
    expect(res.status).toBe(201);
    return subscription;
  }

  /** Only the row: the request names the photo, it never opens it. */
  async function photoOf(tank: Tank, subject: 'message' | 'tank', uploadedBy: TestPerson) {
    const [row] = await stack.database.db
      .insert(photos)
      .values({
        companyId: tank.companyId,
        tankId: tank.id,
        subject,
        objectKey: `urgent-${crypto.randomUUID()}`,
        thumbnailKey: `urgent-${crypto.randomUUID()}-thumbnail`,
        contentType: 'image/webp',
        width: 4,
        height: 3,
        bytes: 12,
        uploadedBy: uploadedBy.id,
      })
      .returning();
    return row!.id;
  }

  describe('GET and PUT /api/urgent-settings', () => {
    it('gives everyone in the company the default first aid, target and no fee until an admin sets them', async () => {
      const { status, body } = await olive.get<UrgentSettingsView>('/api/urgent-settings');

      expect(status).toBe(200);
      expect(body).toMatchObject({ ackTargetMinutes: 30, callOutFeeCents: null, currency: 'EUR' });
      expect(body.firstAid.leak).toEqual({ ...defaultFirstAid.leak, custom: false });
      expect(body.firstAid.power).toEqual({ ...defaultFirstAid.power, custom: false });
    });

    it('lets an admin set the target and one category’s own text, shows the fee from the price list, and records it in the audit trail', async () => {
      const own = {
        steps: [
          'Switch off at the main board if it is dry and safe to reach.',
          'Call us on the out-of-hours line.',
        ],
        cautions: ['Never reset a board that tripped while anything near the tank is wet.'],
      };
      await setCallOutFee('85.00');
      const saved = await ada.put<UrgentSettingsView & ErrorBody>('/api/urgent-settings', {
        ackTargetMinutes: 20,
        firstAid: { power: own, leak: null },
      });
      const read = await olive.get<UrgentSettingsView>('/api/urgent-settings');

      expect(saved.status, JSON.stringify(saved.body)).toBe(200);
      expect(read.body).toEqual(saved.body);
      expect(read.body).toMatchObject({ ackTargetMinutes: 20, callOutFeeCents: 8500, currency: 'GBP' });
      expect(read.body.firstAid.power).toEqual({ ...own, custom: true });
      expect(read.body.firstAid.leak).toEqual({ ...defaultFirstAid.leak, custom: false });
      const [entry] = await stack.database.db
        .select()
        .from(auditEvents)
        .where(and(eq(auditEvents.companyId, companyId), eq(auditEvents.action, 'urgent-settings.changed')));
      expect(entry).toMatchObject({
        actorId: people.ada.id,
        before: { ackTargetMinutes: 30, ownFirstAid: [] },
        after: { ackTargetMinutes: 20, ownFirstAid: ['power'] },
      });
    });

    it('refuses a target under five minutes, and a fee currency that is no ISO 4217 code, naming the fields', async () => {
      const target = await ada.put<ErrorBody>('/api/urgent-settings', { ackTargetMinutes: 2, firstAid: {} });
      const currency = await ada.put<ErrorBody>('/api/billing/settings', {
        currency: 'euro',
        taxRate: '0',
        taxLabel: 'VAT',
        pricesIncludeTax: true,
        paymentTermsDays: 14,
        hourlyRate: null,
        callOutFee: '45.00',
        sellerName: '',
        sellerAddress: '',
        sellerTaxId: '',
        invoiceFooter: '',
      });

      expect(target.status).toBe(400);
      expect(issuePaths(target.body)).toEqual(['body.ackTargetMinutes']);
      expect(currency.status).toBe(400);
      expect(issuePaths(currency.body)).toEqual(['body.currency']);
      expect((await olive.get<UrgentSettingsView>('/api/urgent-settings')).body).toMatchObject({
        ackTargetMinutes: 30,
        callOutFeeCents: null,
      });
    });

    it('keeps the settings to admins', async () => {
      const body = { ackTargetMinutes: 30, firstAid: {} };
      for (const who of [tess, olive]) {
        const res = await who.put<ErrorBody>('/api/urgent-settings', body);
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      }
    });
  });

  describe('POST /api/tanks/:tankId/urgent-requests', () => {
    it('records what is happening, who asked, its photos and equipment, and a snapshot of the tank', async () => {
      const { db } = stack.database;
      const tank = await createTank(db, {
        companyId,
        name: 'Snapshot reef',
        style: 'mixed-reef',
        setUpOn: '2020-01-01',
        owners: [people.olive],
      });
      await insertReadings(db, tank, [
        { parameter: 'temperature', value: 29.1, measuredAt: new Date(Date.now() - 120 * 60_000) },
        { parameter: 'temperature', value: 30.4, measuredAt: new Date(Date.now() - 10 * 60_000) },
        { parameter: 'salinity', value: 35.1, measuredAt: new Date(Date.now() - 60 * 60_000) },
      ]);
      const alert = (status: 'open' | 'resolved', title: string) =>
        db
          .insert(alerts)
          .values({
            companyId,
            tankId: tank.id,
            kind: 'limit',
            ruleKey: `limit:temperature:${crypto.randomUUID()}`,
            parameter: 'temperature',
            severity: 'critical',
            status,
            title,
            body: `${title}.`,
            value: 30.4,
            limitValue: 29,
            direction: 'high',
            openedAt: new Date(Date.now() - 9 * 60_000),
            lastSeenAt: new Date(),
          })
          .returning();
      const [open] = await alert('open', 'Temperature critically high in Snapshot reef');
      await alert('resolved', 'An old alert, long resolved');
      const pump = await addEquipmentTo(db, tank, {
        kind: 'return-pump',
        description: 'Return pump in the sump',
        powerBoard: 'A',
        outlet: '3',
      });
      const photoIds = [
        await photoOf(tank, 'message', people.olive),
        await photoOf(tank, 'message', people.olive),
      ];

      const res = await ask(olive, tank, {
        category: 'equipment',
        equipmentId: pump.id,
        photoIds,
        phone: '0044 20 7946 0958',
      });

      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({
        tankId: tank.id,
        tankName: 'Snapshot reef',
        category: 'equipment',
        equipment: { id: pump.id, name: 'Return pump in the sump', outlet: 'Board A, outlet 3' },
        description: 'Water is dripping from the sump onto the floor.',
        phone: '+44 20 7946 0958',
        access: 'Reception has a key.',
        status: 'requested',
        eta: null,
        technician: null,
        visitId: null,
        requestedBy: { id: people.olive.id, name: 'Olive Owner' },
        callOutFeeCents: null,
        ackTargetMinutes: 30,
        escalationLevel: 0,
      });
      expect(res.body.photos.map((photo) => photo.id)).toEqual(photoIds);
      expect(res.body.photos[0]!.url).toBe(`/api/photos/${photoIds[0]}`);
      expect(res.body.events.map((e) => [e.type, e.actorName])).toEqual([['requested', 'Olive Owner']]);
      expect(res.body.snapshot.readings).toEqual(
        expect.arrayContaining([
          expect.objectContaining({
            parameter: 'temperature',
            label: 'Temperature',
            value: 30.4,
            unit: '°C',
          }),
          expect.objectContaining({ parameter: 'salinity', value: 35.1 }),
        ]),
      );
      expect(res.body.snapshot.readings.filter((r) => r.parameter === 'temperature')).toHaveLength(1);
      expect(res.body.snapshot.openAlerts).toEqual([
        {
          id: open!.id,
          title: 'Temperature critically high in Snapshot reef',
          severity: 'critical',
          openedAt: open!.openedAt.toISOString(),
        },
      ]);
    });

    it('lets staff file a request for a client who phoned', async () => {
      const body = await asked(tess);
      expect(body.requestedBy).toEqual({ id: people.tess.id, name: 'Tess Tech' });
    });

    it('refuses a phone number without its country code or outside any numbering plan, and an unknown category', async () => {
      for (const [fields, paths] of [
        [{ phone: '020 7946 0958' }, ['body.phone']],
        [{ phone: '+44 12' }, ['body.phone']],
        [{ category: 'flood' }, ['body.category']],
      ] as const) {
        const res = await ask(olive, reef, fields);
        expect(res.status, JSON.stringify(fields)).toBe(400);
        expect(res.body.error.code).toBe('invalid_request');
        expect(issuePaths(res.body)).toEqual(paths);
      }
    });

    it('refuses equipment of another tank and photos that are not this person’s request photos of this tank', async () => {
      const { db } = stack.database;
      const before = await db.select({ id: urgentRequests.id }).from(urgentRequests);
      const elsewhere = await addEquipmentTo(db, neighbour);
      const cases: [Record<string, unknown>, string[]][] = [
        [{ equipmentId: elsewhere.id }, ['body.equipmentId']],
        [{ equipmentId: crypto.randomUUID() }, ['body.equipmentId']],
        [{ photoIds: [await photoOf(reef, 'tank', people.olive)] }, ['body.photoIds.0']],
        [{ photoIds: [await photoOf(reef, 'message', people.colin)] }, ['body.photoIds.0']],
        [{ photoIds: [await photoOf(neighbour, 'message', people.olive)] }, ['body.photoIds.0']],
      ];
      const mine = await photoOf(reef, 'message', people.olive);
      cases.push([{ photoIds: [mine, mine] }, ['body.photoIds.1']]);
      cases.push([{ photoIds: Array.from({ length: 6 }, () => mine) }, ['body.photoIds']]);
      for (const [fields, paths] of cases) {
        await refillBudgets();
        const res = await ask(olive, reef, fields);
        expect(res.status, JSON.stringify(fields)).toBe(400);
        expect(issuePaths(res.body), JSON.stringify(fields)).toEqual(paths);
      }
      expect(await db.select({ id: urgentRequests.id }).from(urgentRequests)).toHaveLength(before.length);
    });

    it('refuses a request sent with a call-out fee other than the one in force (409 fee_changed)', async () => {
      await setCallOutFee('45.00');

      const noFeeSeen = await ask(olive, reef, { acceptedCallOutFeeCents: null });
      const oldFee = await ask(olive, reef, { acceptedCallOutFeeCents: 4000 });
      const accepted = await ask(olive, reef, { acceptedCallOutFeeCents: 4500 });

      for (const refused of [noFeeSeen, oldFee]) {
        expect(refused.status).toBe(409);
        expect(refused.body.error.code).toBe('fee_changed');
        expect(refused.body.error.message).toContain('£45.00');
      }
      expect(accepted.status).toBe(201);
      expect(accepted.body).toMatchObject({ callOutFeeCents: 4500, currency: 'GBP' });
    });

    it('allows five requests per tank an hour; the sixth is refused with 429 and Retry-After', async () => {
      const tank = await createTank(stack.database.db, {
        companyId,
        name: 'Busy reef',
        owners: [people.olive],
      });
      for (let n = 0; n < 5; n += 1) await asked(olive, tank);

      const sixth = await ask(olive, tank);
      const otherTank = await ask(nina, neighbour);

      expect(sixth.status).toBe(429);
      expect(sixth.body.error.code).toBe('rate_limited');
      expect(Number(sixth.headers.get('retry-after'))).toBeGreaterThan(0);
      expect(otherTank.status).toBe(201);
    });

    it('answers 404 for another owner’s tank and another company’s, and spends nothing of the tank’s budget', async () => {
      for (const [who, tank] of [
        [nina, reef],
        [otherAdmin, reef],
        [olive, foreignTank],
      ] as const) {
        for (let n = 0; n < 6; n += 1) {
          const res = await ask(who, tank);
          expect(res.status).toBe(404);
          expect(res.body.error.code).toBe('not_found');
        }
      }
      expect((await ask(olive, reef)).status).toBe(201);
    });
  });

  describe('who hears of a new request', () => {
    it('tells whoever is on call now on every channel at high urgency, whatever their preferences', async () => {
      const now = new Date();
      const clock = (at: Date) => at.toISOString().slice(11, 16);
      // Tess turned everything off and is in quiet hours; an urgent request reaches her all the same.
      const quiet = await tess.put('/api/notifications/preferences', {
        ...defaultNotificationPreferences,
        push: [],
        email: [],
        inApp: [],
        urgentUpdates: [],
        quietHours: {
          start: clock(new Date(now.getTime() - 2 * 3_600_000)),
          end: clock(new Date(now.getTime() + 2 * 3_600_000)),
        },
        timeZone: 'UTC',
      });
      expect(quiet.status).toBe(200);
      expect(
        (await onCall(people.tess, new Date(now.getTime() - 3_600_000), new Date(now.getTime() + 3_600_000)))
          .status,
      ).toBe(201);
      await subscribeToPush(tess);

      const request = await asked(olive, reef, { access: 'Side door, code at reception.' });
      const [event] = await eventsOf(request.id);

      const told = await notificationsFor(event!.id);
      expect(told.map((n) => [n.userId, n.severity, n.title, n.link]).sort()).toEqual(
        [
          [
            people.tess.id,
            'critical',
            'Urgent visit requested: Water leak or flood at Lobby reef',
            `/urgent/${request.id}`,
          ],
          // The co-owner hears of it too; Olive, who sent it, does not.
          [
            people.colin.id,
            'critical',
            'Urgent visit requested: Water leak or flood',
            `/urgent/${request.id}`,
          ],
        ].sort(),
      );
      const planned = await deliveriesFor(event!.id);
      const tessDeliveries = planned.filter((d) => d.userId === people.tess.id);
      expect(tessDeliveries.map((d) => d.channel).sort()).toEqual(['email', 'push']);
      expect(planned.some((d) => d.userId === people.ada.id || d.userId === people.abe.id)).toBe(false);

      for (const delivery of tessDeliveries) {
        if (delivery.channel === 'push') await deliverPushJob(stack.deps, delivery.id);
        else await deliverEmailJob(stack.deps, delivery.id);
      }
      const [pushed] = push.received();
      expect(pushed).toMatchObject({
        status: 201,
        urgency: 'high',
        payload: {
          title: 'Urgent visit requested: Water leak or flood at Lobby reef',
          url: `/urgent/${request.id}`,
        },
      });
      const mail = await stack.mail.waitFor((m) => m.to.includes(people.tess.email));
      expect(mail.subject).toBe('Urgent visit requested: Water leak or flood at Lobby reef');
      for (const fact of [
        'Lobby reef',
        'Water leak or flood',
        '+44 20 7946 0958',
        'Side door, code at reception',
        'Water is dripping from the sump onto the floor',
      ]) {
        expect(mail.text).toContain(fact);
      }
      // Staff act on it; the owner's first-aid text is not for them.
      expect(mail.text).not.toContain(defaultFirstAid.leak.steps[0]!);
      expect(mail.text).toContain(`/urgent/${request.id}`);
    });

    it('tells the company’s admins when nobody is on call', async () => {
      const request = await asked();
      const [event] = await eventsOf(request.id);

      const told = (await notificationsFor(event!.id)).map((n) => n.userId);
      expect(told).toEqual(expect.arrayContaining([people.ada.id, people.abe.id]));
      expect(told).not.toContain(people.tess.id);
      expect(told).not.toContain(people.olive.id);
    });

    it('follows the on-call roster on the company’s wall clock across the night the clocks go back', async () => {
      const { db } = stack.database;
      const issuer = stack.idp.issuer;
      const berlin = 'Europe/Berlin';
      const company = await createCompany(db, { timeZone: berlin });
      const make = (role: TestPerson['role'], name: string) =>
        createPerson(db, { companyId: company.id, role, issuer, name });
      const [boss, night, owner] = [
        await make('admin', 'Berta Boss'),
        await make('technician', 'Nacht Tech'),
        await make('owner', 'Otto Owner'),
      ];
      const bossSession = await signedIn(stack, boss);
      const tank = await createTank(db, {
        companyId: company.id,
        name: 'Aquarium am Fluss',
        owners: [owner],
      });
      // The last Sunday of October, when Berlin goes from 03:00 summer time back to 02:00, at least two days ahead.
      const lastSundayOfOctober = (year: number) => {
        for (let day = 31; ; day -= 1) if (new Date(Date.UTC(year, 9, day)).getUTCDay() === 0) return day;
      };
      let year = new Date().getUTCFullYear();
      if (Date.UTC(year, 9, lastSundayOfOctober(year)) < Date.now() + 2 * 86_400_000) year += 1;
      const sunday = lastSundayOfOctober(year);
      const local = (day: number, hours: number, mins = 0) =>
        new TZDate(year, 9, day, hours, mins, 0, berlin);
      // The night shift, 18:00 Saturday to 08:00 Sunday on the wall clock: 15 hours that night.
      const startsAt = local(sunday - 1, 18);
      const endsAt = local(sunday, 8);
      expect(endsAt.getTime() - startsAt.getTime()).toBe(15 * 3_600_000);
      const shift = await bossSession.post('/api/on-call', {
        userId: night.id,
        startsAt: startsAt.toISOString(),
        endsAt: endsAt.toISOString(),
      });
      expect(shift.status, JSON.stringify(shift.body)).toBe(201);

      // Sessions end when the clock jumps months ahead, so the request goes through the service the route calls.
      const asOwner = (await findActiveActor(db, owner.id))!;
      const toldAt = async (hours: number, mins: number) => {
        stack.clock.set(local(sunday, hours, mins));
        const request = await createUrgentRequest(
          stack.deps,
          asOwner,
          tank.id,
          urgentRequestInput.parse(validRequest()),
        );
        const [event] = await eventsOf(request.id);
        return (await notificationsFor(event!.id)).map((n) => n.userId);
      };
      // 07:30 on Sunday, after the clocks went back: still the night shift.
      expect(await toldAt(7, 30)).toEqual([night.id]);
      // 08:30: the shift is over, so the admin hears of it.
      expect(await toldAt(8, 30)).toEqual([boss.id]);
    });
  });

  describe('POST /api/urgent-requests/:requestId/moves', () => {
    it('walks a request from asked to resolved, planning the urgent visit at the arrival estimate and giving it to whoever is assigned', async () => {
      const request = await asked();
      const eta = inMinutes(45);

      const acknowledged = await moved(ada, request.id, {
        to: 'acknowledged',
        eta,
        note: 'Keep the pump off.',
      });
      expect(acknowledged).toMatchObject({ status: 'acknowledged', eta });
      expect(acknowledged.acknowledgedAt).not.toBeNull();

      const assigned = await moved(ada, request.id, { to: 'assigned', technicianId: people.tess.id });
      expect(assigned).toMatchObject({
        status: 'assigned',
        technician: { id: people.tess.id, name: 'Tess Tech' },
      });
      expect(assigned.visitId).not.toBeNull();
      const visit = (await ada.get<VisitDetail>(`/api/visits/${assigned.visitId}`)).body;
      expect(visit).toMatchObject({
        kind: 'urgent',
        status: 'scheduled',
        tankId: reef.id,
        technician: { id: people.tess.id },
        windowStart: eta,
        windowEnd: new Date(Date.parse(eta) + 2 * 3_600_000).toISOString(),
      });

      const later = inMinutes(70);
      const reassigned = await moved(ada, request.id, {
        to: 'assigned',
        technicianId: people.theo.id,
        eta: later,
      });
      expect(reassigned).toMatchObject({
        visitId: assigned.visitId,
        technician: { id: people.theo.id },
        eta: later,
      });
      const movedVisit = (await ada.get<VisitDetail>(`/api/visits/${assigned.visitId}`)).body;
      expect(movedVisit).toMatchObject({ technician: { id: people.theo.id }, windowStart: later });

      await moved(theo, request.id, { to: 'on-the-way', eta: later });
      await moved(theo, request.id, { to: 'on-site' });
      const resolved = await moved(theo, request.id, { to: 'resolved', note: 'Hose clamp tightened.' });

      expect(resolved.status).toBe('resolved');
      expect(resolved.closedAt).not.toBeNull();
      expect(resolved.events.map((e) => [e.type, e.actorName, e.note])).toEqual([
        ['requested', 'Olive Owner', ''],
        ['acknowledged', 'Ada Admin', 'Keep the pump off.'],
        ['assigned', 'Ada Admin', ''],
        ['assigned', 'Ada Admin', ''],
        ['on-the-way', 'Theo Tech', ''],
        ['on-site', 'Theo Tech', ''],
        ['resolved', 'Theo Tech', 'Hose clamp tightened.'],
      ]);
      // The owner follows it to the urgent visit, whose report they read once it is published.
      const forOwner = await getRequest(olive, request.id);
      expect(forOwner.body).toMatchObject({ status: 'resolved', visitId: assigned.visitId });
    });

    it('allows exactly the moves of the lifecycle and refuses every other with 409 invalid_transition', async () => {
      for (const from of urgentStatuses) {
        for (const to of moveTargets) {
          const row = await requestIn(from);
          const res = await move(ada, row.id, bodyFor(to));
          const after = await rowOf(row.id);
          const events = await eventsOf(row.id);
          if (canMove(from, to)) {
            expect(res.status, `${from} → ${to}: ${JSON.stringify(res.body)}`).toBe(200);
            expect(after.status, `${from} → ${to}`).toBe(to);
            expect(events.map((e) => e.type)).toEqual([to]);
          } else {
            expect(res.status, `${from} → ${to}`).toBe(409);
            expect(res.body.error.code).toBe('invalid_transition');
            expect(res.body.error.message).toContain(urgentStatusNames[from]);
            for (const next of urgentTransitions[from])
              expect(res.body.error.message).toContain(urgentStatusNames[next]);
            expect(after).toEqual(row);
            expect(events).toEqual([]);
          }
        }
      }
      // "Requested" is where a request starts, never a move.
      const res = await move(ada, (await requestIn('acknowledged')).id, bodyFor('requested'));
      expect(res.status).toBe(400);
    });

    it('lets one of two staff making the same move at once win; the other gets 409 and nothing is written twice', async () => {
      const request = await asked();
      const answers = await Promise.all([
        move(ada, request.id, { to: 'acknowledged', eta: inMinutes(30) }),
        move(tess, request.id, { to: 'acknowledged', eta: inMinutes(50) }),
      ]);
      expect(answers.map((a) => a.status).sort()).toEqual([200, 409]);
      expect(answers.find((a) => a.status === 409)!.body.error.code).toBe('invalid_transition');
      expect((await eventsOf(request.id)).map((e) => e.type)).toEqual(['requested', 'acknowledged']);

      // Two admins giving it to different technicians at once: one of them is told it changed.
      const both = await Promise.all([
        move(ada, request.id, { to: 'assigned', technicianId: people.tess.id }),
        move(abe, request.id, { to: 'assigned', technicianId: people.theo.id }),
      ]);
      expect(both.map((a) => a.status).sort()).toEqual([200, 409]);
      const winner = both.find((a) => a.status === 200)!.body;
      expect((await rowOf(request.id)).technicianId).toBe(winner.technician!.id);
      expect((await eventsOf(request.id)).map((e) => e.type)).toEqual([
        'requested',
        'acknowledged',
        'assigned',
      ]);
    });

    it('checks what each move needs: an arrival estimate, an active member of staff, a reason and advice', async () => {
      const request = await asked();
      const noEta = await move(ada, request.id, { to: 'acknowledged' });
      await moved(ada, request.id, { to: 'acknowledged', eta: inMinutes(30) });
      const notDeclined = await move(ada, request.id, { to: 'declined', reason: 'Fully booked.' });

      expect(noEta.status).toBe(400);
      expect(issuePaths(noEta.body)).toEqual(['body.eta']);
      expect(notDeclined.status).toBe(400);
      expect(issuePaths(notDeclined.body)).toEqual(['body.advice']);
      for (const technicianId of [people.olive.id, deactivatedId, otherTechnicianId, crypto.randomUUID()]) {
        const res = await move(ada, request.id, { to: 'assigned', technicianId });
        expect(res.status).toBe(400);
        expect(issuePaths(res.body)).toEqual(['body.technicianId']);
      }
      expect((await rowOf(request.id)).status).toBe('acknowledged');
    });

    it('keeps the visits rule: a technician plans their own urgent visit, only an admin gives it to a colleague', async () => {
      const request = await asked();
      await moved(tess, request.id, { to: 'acknowledged', eta: inMinutes(30) });

      const toColleague = await move(tess, request.id, { to: 'assigned', technicianId: people.theo.id });
      const toHerself = await move(tess, request.id, { to: 'assigned', technicianId: people.tess.id });

      expect(toColleague.status).toBe(403);
      expect(toHerself.status).toBe(200);
      expect((await eventsOf(request.id)).map((e) => e.type)).toEqual([
        'requested',
        'acknowledged',
        'assigned',
      ]);
    });

    it('takes the urgent visit off the schedule when an assigned request is declined', async () => {
      const request = await asked();
      await moved(ada, request.id, { to: 'acknowledged', eta: inMinutes(30) });
      const { visitId } = await moved(ada, request.id, { to: 'assigned', technicianId: people.tess.id });

      const declined = await moved(ada, request.id, bodyFor('declined'));

      expect(declined).toMatchObject({
        status: 'declined',
        declineReason: 'Both technicians are at other emergencies.',
        advice: 'Keep the return pump off and the lid on; we call you at 08:00.',
      });
      expect(declined.closedAt).not.toBeNull();
      expect((await ada.get<VisitDetail>(`/api/visits/${visitId}`)).body.status).toBe('cancelled');
    });

    it('resolves the request when its urgent visit’s report is published while the technician is on site', async () => {
      const request = await asked();
      await moved(tess, request.id, { to: 'acknowledged', eta: inMinutes(-20) });
      const { visitId } = await moved(tess, request.id, { to: 'assigned', technicianId: people.tess.id });
      await moved(tess, request.id, { to: 'on-the-way' });
      await moved(tess, request.id, { to: 'on-site' });
      const draft = await tess.get<VisitDetail>(`/api/visits/${visitId}`);
      const saved = await tess.put<VisitDetail>(`/api/visits/${visitId}/report`, {
        version: draft.body.version,
        content: {
          arrivedAt: new Date(Date.now() - 15 * 60_000).toISOString(),
          departedAt: new Date(Date.now() - 60_000).toISOString(),
          tasksDone: ['equipment-check'],
          notes: 'Tightened the hose clamp on the return line; the floor is dry.',
        },
      });
      expect(saved.status, JSON.stringify(saved.body)).toBe(200);

      const published = await tess.post(`/api/visits/${visitId}/publish`, { version: saved.body.version });

      expect(published.status).toBe(200);
      const after = await getRequest(olive, request.id);
      expect(after.body).toMatchObject({ status: 'resolved', visitId });
      expect(after.body.closedAt).not.toBeNull();
      expect(after.body.events.at(-1)).toMatchObject({
        type: 'resolved',
        actorName: 'Tess Tech',
        note: 'The visit report is published.',
      });
    });

    it('tells the owners of each change on the channels they chose, in words, with the technician and estimate', async () => {
      const { db } = stack.database;
      const prefs = (urgentUpdates: string[]) => ({
        ...defaultNotificationPreferences,
        timeZone: london,
        urgentUpdates,
      });
      expect((await olive.put('/api/notifications/preferences', prefs(['email']))).status).toBe(200);
      expect((await colin.put('/api/notifications/preferences', prefs(['in-app']))).status).toBe(200);
      try {
        const request = await asked(tess);
        const eta = new Date(Date.parse(inMinutes(40)));
        await moved(ada, request.id, { to: 'acknowledged', eta: eta.toISOString() });
        await moved(ada, request.id, { to: 'assigned', technicianId: people.theo.id });
        const declinedRequest = await asked(tess);
        await moved(ada, declinedRequest.id, {
          to: 'declined',
          reason: 'Both technicians are at other emergencies.',
          advice: 'Keep the return pump off and the lid on.',
        });
        const [, acknowledged, assigned] = await eventsOf(request.id);
        const [, declined] = await eventsOf(declinedRequest.id);
        const when = formatDateTime(eta, london);

        const inApp = async (eventId: string) =>
          (await notificationsFor(eventId)).filter((n) =>
            [people.olive.id, people.colin.id].includes(n.userId),
          );
        const [ackNote] = await inApp(acknowledged!.id);
        expect(ackNote).toMatchObject({ userId: people.colin.id, title: 'Urgent visit: Acknowledged' });
        expect(ackNote!.body).toContain(`expected by ${when}`);
        const [assignNote] = await inApp(assigned!.id);
        expect(assignNote).toMatchObject({ title: 'Urgent visit: Technician assigned' });
        expect(assignNote!.body).toContain('Theo Tech will come to Lobby reef');
        const [declineNote] = await inApp(declined!.id);
        expect(declineNote).toMatchObject({ title: 'Urgent visit: Declined' });
        expect(declineNote!.body).toContain('Both technicians are at other emergencies.');
        expect(declineNote!.body).toContain('Keep the return pump off and the lid on.');

        // Olive chose e-mail only: a delivery per change, no in-app notification.
        for (const event of [acknowledged!, assigned!, declined!]) {
          const mine = (await deliveriesFor(event.id)).filter((d) => d.userId === people.olive.id);
          expect(mine.map((d) => d.channel)).toEqual(['email']);
        }
        const [mailed] = (await deliveriesFor(assigned!.id)).filter((d) => d.userId === people.olive.id);
        await deliverEmailJob(stack.deps, mailed!.id);
        const mail = await stack.mail.waitFor((m) => m.to.includes(people.olive.email));
        expect(mail.subject).toBe('Urgent visit: Technician assigned');
        expect(mail.text).toContain('Theo Tech will come to Lobby reef');
        expect(mail.text).toContain(`/urgent/${request.id}`);
        // Theo hears the request is his.
        expect((await notificationsFor(assigned!.id)).map((n) => n.userId)).toContain(people.theo.id);
      } finally {
        await db
          .delete(notificationPreferences)
          .where(inArray(notificationPreferences.userId, [people.olive.id, people.colin.id]));
      }
    });
  });

  describe('escalation', () => {
    it('goes to the admins at the acknowledgement target, and to the admins and whoever is on call at twice the target', async () => {
      const request = await asked();
      const created = Date.parse(request.createdAt);
      await onCall(people.tess, new Date(created - 3_600_000), new Date(created + 3 * 3_600_000));
      await subscribeToPush(ada);
      const escalationsOf = async () =>
        (await eventsOf(request.id)).filter((event) => event.type === 'escalated');

      stack.clock.set(new Date(created + minutes(29)));
      await escalateOverdueRequests(stack.deps);
      expect(await escalationsOf()).toEqual([]);

      stack.clock.set(new Date(created + minutes(30)));
      await escalateOverdueRequests(stack.deps);
      const [first] = await escalationsOf();
      expect(first).toMatchObject({ type: 'escalated', actorName: null });
      expect((await rowOf(request.id)).escalationLevel).toBe(1);
      const firstTold = await notificationsFor(first!.id);
      expect(firstTold.map((n) => n.userId).sort()).toEqual([people.ada.id, people.abe.id].sort());
      expect(
        firstTold.every((n) => n.severity === 'critical' && n.title.startsWith('Not yet acknowledged')),
      ).toBe(true);
      const [adaPush] = (await deliveriesFor(first!.id)).filter(
        (d) => d.userId === people.ada.id && d.channel === 'push',
      );
      await deliverPushJob(stack.deps, adaPush!.id);
      expect(push.received()).toEqual([
        expect.objectContaining({
          status: 201,
          urgency: 'high',
          payload: expect.objectContaining({
            title: 'Not yet acknowledged: Water leak or flood at Lobby reef',
          }),
        }),
      ]);

      stack.clock.set(new Date(created + minutes(59)));
      await escalateOverdueRequests(stack.deps);
      expect(await escalationsOf()).toHaveLength(1);

      stack.clock.set(new Date(created + minutes(60)));
      await escalateOverdueRequests(stack.deps);
      const [, second] = await escalationsOf();
      expect((await rowOf(request.id)).escalationLevel).toBe(2);
      expect((await notificationsFor(second!.id)).map((n) => n.userId).sort()).toEqual(
        [people.ada.id, people.abe.id, people.tess.id].sort(),
      );

      stack.clock.set(new Date(created + minutes(240)));
      await escalateOverdueRequests(stack.deps);
      expect(await escalationsOf()).toHaveLength(2);

      // Owners never hear of it, nor see it on the request.
      const ownerIds = [people.olive.id, people.colin.id];
      for (const event of [first!, second!]) {
        const told = (await notificationsFor(event.id)).map((n) => n.userId);
        expect(told.filter((id) => ownerIds.includes(id))).toEqual([]);
      }
      const forOwner = (await getRequest(olive, request.id)).body;
      expect(forOwner.events.map((e) => e.type)).toEqual(['requested']);
      expect(forOwner.escalationLevel).toBe(0);
      const forStaff = (await getRequest(tess, request.id)).body;
      expect(forStaff.events.map((e) => e.type)).toEqual(['requested', 'escalated', 'escalated']);
      expect(forStaff.escalationLevel).toBe(2);
      const listed = (await olive.get<View[]>(`/api/tanks/${reef.id}/urgent-requests`)).body;
      expect(JSON.stringify(listed)).not.toContain('escalated');
    });

    it('leaves an acknowledged request alone, and follows the company’s own target', async () => {
      await ada.put('/api/urgent-settings', { ackTargetMinutes: 10, firstAid: {} });
      const acknowledged = await asked();
      await moved(ada, acknowledged.id, { to: 'acknowledged', eta: inMinutes(30) });
      const waiting = await asked();

      stack.clock.set(new Date(Date.parse(waiting.createdAt) + minutes(10)));
      await escalateOverdueRequests(stack.deps);

      expect((await eventsOf(acknowledged.id)).map((e) => e.type)).toEqual(['requested', 'acknowledged']);
      expect((await eventsOf(waiting.id)).map((e) => e.type)).toEqual(['requested', 'escalated']);
    });

    it('plans again the notifications of an event left unannounced for over a minute', async () => {
      const request = await asked();
      const [event] = await stack.database.db
        .insert(urgentRequestEvents)
        .values({
          requestId: request.id,
          type: 'acknowledged',
          actorId: people.ada.id,
          actorName: 'Ada Admin',
          eta: new Date(Date.now() + 30 * 60_000),
          at: new Date(Date.now() - 2 * 60_000),
        })
        .returning();

      expect(await unannouncedUrgentEvents(stack.deps, 60_000)).toContain(event!.id);
      await fanOutUrgentEvent(stack.deps, event!.id);

      expect(await unannouncedUrgentEvents(stack.deps, 60_000)).not.toContain(event!.id);
      expect((await notificationsFor(event!.id)).map((n) => n.userId).sort()).toEqual(
        [people.olive.id, people.colin.id].sort(),
      );
    });
  });

  describe('reading requests', () => {
    it('lists a tank’s requests newest first, and the staff board’s open ones oldest first', async () => {
      const tank = await createTank(stack.database.db, {
        companyId,
        name: 'Listed reef',
        owners: [people.olive],
      });
      const first = await asked(olive, tank);
      const second = await asked(olive, tank);
      await moved(ada, second.id, {
        to: 'declined',
        reason: 'We are closed today.',
        advice: 'Switch the heater off and keep the lid on.',
      });

      const listed = await olive.get<View[]>(`/api/tanks/${tank.id}/urgent-requests`);
      const open = await tess.get<View[]>('/api/urgent-requests?state=open');
      const closed = await tess.get<View[]>('/api/urgent-requests?state=closed');

      expect(listed.body.map((r) => r.id)).toEqual([second.id, first.id]);
      const openIds = open.body.map((r) => r.id);
      expect(openIds).toContain(first.id);
      expect(openIds).not.toContain(second.id);
      const created = open.body.map((r) => r.createdAt);
      expect(created).toEqual([...created].sort());
      expect(closed.body.map((r) => r.id)).toContain(second.id);
      expect(closed.body.find((r) => r.id === second.id)).toMatchObject({
        status: 'declined',
        declineReason: 'We are closed today.',
        advice: 'Switch the heater off and keep the lid on.',
      });
      expect((await otherAdmin.get<View[]>('/api/urgent-requests?state=open')).body).toEqual([]);
    });

    it('answers 404 to another owner and another company, and 403 to an owner moving a request or reading the board', async () => {
      const request = await asked();
      for (const who of [nina, otherAdmin]) {
        expect((await getRequest(who, request.id)).status).toBe(404);
        expect((await who.get<ErrorBody>(`/api/tanks/${reef.id}/urgent-requests`)).status).toBe(404);
      }
      const byOtherAdmin = await move(otherAdmin, request.id, bodyFor('acknowledged'));
      expect(byOtherAdmin.status).toBe(404);
      expect(byOtherAdmin.body.error.code).toBe('not_found');
      for (const owner of [olive, nina]) {
        const res = await move(owner, request.id, bodyFor('acknowledged'));
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
        expect((await owner.get<ErrorBody>('/api/urgent-requests')).status).toBe(403);
      }
      expect((await getRequest(olive, request.id)).status).toBe(200);
      expect((await getRequest(olive, crypto.randomUUID())).status).toBe(404);
      expect((await rowOf(request.id)).status).toBe('requested');
    });
  });

  it('keeps every event of a request to one row per change, however many times its notifications are planned', async () => {
    const request = await asked();
    const [event] = await eventsOf(request.id);
    const before = await notificationsFor(event!.id);

    await fanOutUrgentEvent(stack.deps, event!.id);
    await fanOutUrgentEvent(stack.deps, event!.id);

    const after = await notificationsFor(event!.id);
    expect(after.map((n) => n.id).sort()).toEqual(before.map((n) => n.id).sort());
    const planned = await stack.database.db
      .select()
      .from(deliveries)
      .where(inArray(deliveries.urgentEventId, [event!.id]));
    expect(new Set(planned.map((d) => `${d.userId}:${d.channel}:${d.destination}`)).size).toBe(
      planned.length,
    );
  });
});

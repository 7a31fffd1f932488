import { tzOffset } from '@date-fns/tz';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AlertView as Alert } from '@shared/schemas/alerts';
import type { LivestockItem } from '@shared/schemas/livestock';
import type { PhotoItem } from '@shared/schemas/photos';
import type { ReadingHistory } from '@shared/schemas/readings';
import type {
  TankVisits,
  VisitDetail,
  VisitReportContent,
  VisitReportInput,
  VisitSummary,
} from '@shared/schemas/visits';
import { wallTimeOf } from '@shared/visits/recurrence';
import {
  deliveries,
  livestock,
  notifications,
  pushSubscriptions,
  readings,
  tanks,
  visits,
} from '../../api/db/schema/index';
import { deliverEmail, fanOutVisitReport } from '../../api/services/notify';
import { issuePaths, signedIn, type ApiSession } from '../helpers/api-session';
import {
  addEquipmentTo,
  addLivestockTo,
  createCompany,
  createPerson,
  createTank,
  type TestPerson,
} from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';
import { makeImage } from './photos/test-images';

type Tank = typeof tanks.$inferSelect;
type ErrorBody = { error: { code: string; message: string; issues?: { path: string; message: string }[] } };

const dayMs = 86_400_000;
const isoDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);
/** A calendar day `n` days from today (UTC), inside the year ahead that dates may name. */
const inDays = (n: number) => isoDay(Date.now() + n * dayMs);
const minutesAgo = (n: number) => new Date(Date.now() - n * 60_000).toISOString();
const london = 'Europe/London';

/**
 * The first day from `fromDays` days ahead on which the clocks in `zone` change, and the UTC
 * offsets (minutes) before and after.
 */
function nextClockChange(zone: string, fromDays: number) {
  const noonOf = (day: string) => new Date(`${day}T12:00:00Z`);
  for (let n = fromDays; n <= 366; n += 1) {
    const [before, day] = [inDays(n - 1), inDays(n)];
    const offsetBefore = tzOffset(zone, noonOf(before));
    const offsetAfter = tzOffset(zone, noonOf(day));
    if (offsetBefore !== offsetAfter) return { day, offsetBefore, offsetAfter };
  }
  throw new Error(`no clock change in ${zone} within a year`);
}

describe('service visits', () => {
  let stack: TestStack;
  let companyId: string;
  let tessPerson: TestPerson;
  let theoPerson: TestPerson;
  let ownerPerson: TestPerson;
  let admin: ApiSession;
  let tess: ApiSession;
  let theo: ApiSession;
  let owner: ApiSession;
  let otherOwner: ApiSession;
  let otherAdmin: ApiSession;
  let otherTechnicianId: string;
  let reef: Tank;
  let foreignTank: Tank;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    companyId = (await createCompany(db, { timeZone: london })).id;
    const otherCompanyId = (await createCompany(db)).id;
    tessPerson = await createPerson(db, { companyId, role: 'technician', issuer, name: 'Tess Tech' });
    theoPerson = await createPerson(db, { companyId, role: 'technician', issuer, name: 'Theo Tech' });
    ownerPerson = await createPerson(db, { companyId, role: 'owner', issuer, name: 'Olive Owner' });
    const otherOwnerPerson = await createPerson(db, { companyId, role: 'owner', issuer });
    otherTechnicianId = (await createPerson(db, { companyId: otherCompanyId, role: 'technician', issuer }))
      .id;
    admin = await signedIn(
      stack,
      await createPerson(db, { companyId, role: 'admin', issuer, name: 'Ada Admin' }),
    );
    tess = await signedIn(stack, tessPerson);
    theo = await signedIn(stack, theoPerson);
    owner = await signedIn(stack, ownerPerson);
    otherOwner = await signedIn(stack, otherOwnerPerson);
    otherAdmin = await signedIn(
      stack,
      await createPerson(db, { companyId: otherCompanyId, role: 'admin', issuer }),
    );
    reef = await newReef('Lobby reef');
    await createTank(db, { companyId, name: 'Other client', owners: [otherOwnerPerson] });
    foreignTank = await createTank(db, { companyId: otherCompanyId, name: 'Elsewhere' });
  });
  afterAll(() => stack.close());

  /** A mixed reef of 300 + 100 litres in London, set up long ago so any reading today fits. */
  function newReef(
    name: string,
    columns: Partial<typeof tanks.$inferInsert> & { owners?: { id: string }[] } = {},
  ) {
    return createTank(stack.database.db, {
      companyId,
      name,
      style: 'mixed-reef',
      waterType: 'marine',
      displayVolumeL: 300,
      sumpVolumeL: 100,
      setUpOn: '2020-01-01',
      timeZone: london,
      owners: [ownerPerson],
      ...columns,
    });
  }

  const schedule = (who: ApiSession, tank: { id: string }, fields: Record<string, unknown> = {}) =>
    who.post<VisitSummary & ErrorBody>('/api/visits', {
      tankId: tank.id,
      kind: 'routine',
      date: inDays(0),
      startTime: '09:00',
      endTime: '10:30',
      ...fields,
    });

  async function scheduled(
    tank: { id: string },
    fields: Record<string, unknown> = {},
    who: ApiSession = tess,
  ) {
    const res = await schedule(who, tank, fields);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body;
  }

  const visitPath = (id: string, rest = '') => `/api/visits/${id}${rest}`;
  const saveReport = (who: ApiSession, id: string, version: number, content: VisitReportInput) =>
    who.put<VisitDetail & ErrorBody>(visitPath(id, '/report'), { version, content });
  const publish = (who: ApiSession, id: string, version: number) =>
    who.post<VisitDetail & ErrorBody>(visitPath(id, '/publish'), { version });

  /** A report as a technician leaves it: arrived an hour ago, left ten minutes ago. */
  const report = (fields: VisitReportInput = {}): VisitReportInput => ({
    arrivedAt: minutesAgo(60),
    departedAt: minutesAgo(10),
    tasksDone: ['glass', 'skimmer-cup'],
    notes: 'Cleaned the glass and emptied the skimmer cup.',
    ...fields,
  });

  /** Saves the report on top of the visit's current version, then publishes it. */
  async function savedAndPublished(visitId: string, content: VisitReportInput, who: ApiSession = tess) {
    const current = await who.get<VisitDetail>(visitPath(visitId));
    const saved = await saveReport(who, visitId, current.body.version, content);
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    const published = await publish(who, visitId, saved.body.version);
    expect(published.status, JSON.stringify(published.body)).toBe(200);
    return published.body;
  }

  const visitRow = async (id: string) =>
    (await stack.database.db.select().from(visits).where(eq(visits.id, id)))[0]!;

  describe('POST /api/visits', () => {
    it('schedules a visit for the technician who plans it, on the wall clock of the tank', async () => {
      const res = await schedule(tess, reef, { date: inDays(3), note: 'Bring the spare heater.' });

      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({
        tankId: reef.id,
        tankName: 'Lobby reef',
        timeZone: london,
        kind: 'routine',
        status: 'scheduled',
        technician: { id: tessPerson.id, name: 'Tess Tech' },
        repeats: false,
        note: 'Bring the spare heater.',
        publishedAt: null,
      });
      expect(wallTimeOf(new Date(res.body.windowStart), london)).toEqual({ day: inDays(3), time: '09:00' });
      expect(wallTimeOf(new Date(res.body.windowEnd), london)).toEqual({ day: inDays(3), time: '10:30' });
    });

    it('lets an admin give a visit to a technician, and refuses a technician who names someone else', async () => {
      const given = await schedule(admin, reef, { technicianId: theoPerson.id });
      const refused = await schedule(tess, reef, { technicianId: theoPerson.id });

      expect(given.status).toBe(201);
      expect(given.body.technician).toEqual({ id: theoPerson.id, name: 'Theo Tech' });
      expect(refused.status).toBe(403);
    });

    it('names the technician field when nobody active of the company goes by that id', async () => {
      const unknown = await schedule(admin, reef, { technicianId: '0b6f1c7e-4a8d-4e0b-9b1f-3c2d5e6f7a8b' });
      const otherCompanys = await schedule(admin, reef, { technicianId: otherTechnicianId });
      const anOwner = await schedule(admin, reef, { technicianId: ownerPerson.id });

      for (const res of [unknown, otherCompanys, anOwner]) {
        expect(res.status).toBe(400);
        expect(issuePaths(res.body)).toEqual(['body.technicianId']);
      }
    });

    it('names the fields of a window that ends before it starts, or a one-off that repeats', async () => {
      const backwards = await schedule(tess, reef, { startTime: '11:00', endTime: '10:00' });
      const urgentSeries = await schedule(tess, reef, { kind: 'urgent', repeats: true });
      const tooFar = await schedule(tess, reef, { date: inDays(400) });

      expect(backwards.status).toBe(400);
      expect(issuePaths(backwards.body)).toEqual(['body.endTime']);
      expect(urgentSeries.status).toBe(400);
      expect(issuePaths(urgentSeries.body)).toEqual(['body.repeats']);
      expect(tooFar.status).toBe(400);
      expect(issuePaths(tooFar.body)).toEqual(['body.date']);
    });

    it('refuses owners (403), and answers 404 for a tank of another company', async () => {
      const byOwner = await schedule(owner, reef);
      const foreignByUs = await schedule(tess, foreignTank);
      const oursByThem = await schedule(otherAdmin, reef);

      expect(byOwner.status).toBe(403);
      expect(foreignByUs.status).toBe(404);
      expect(oursByThem.status).toBe(404);
      expect(oursByThem.body.error.code).toBe('not_found');
    });
  });

  describe('PATCH /api/visits/:visitId', () => {
    it('lets an admin reassign a visit to another technician', async () => {
      const visit = await scheduled(reef);

      const res = await admin.patch<VisitSummary>(visitPath(visit.id), { technicianId: theoPerson.id });

      expect(res.status).toBe(200);
      expect(res.body.technician).toEqual({ id: theoPerson.id, name: 'Theo Tech' });
    });

    it('refuses a technician who gives their visit to someone else, and changes nothing', async () => {
      const visit = await scheduled(reef);

      const res = await tess.patch(visitPath(visit.id), { technicianId: theoPerson.id });

      expect(res.status).toBe(403);
      expect((await visitRow(visit.id)).technicianId).toBe(tessPerson.id);
    });

    it('moves a visit to a new wall time, cancels it and restores it', async () => {
      const visit = await scheduled(reef);

      const moved = await tess.patch<VisitSummary>(visitPath(visit.id), {
        date: inDays(5),
        startTime: '14:00',
        endTime: '15:00',
      });
      const half = await tess.patch(visitPath(visit.id), { date: inDays(6) });
      const cancelled = await tess.patch<VisitSummary>(visitPath(visit.id), { cancelled: true });
      const restored = await tess.patch<VisitSummary>(visitPath(visit.id), { cancelled: false });

      expect(moved.status).toBe(200);
      expect(wallTimeOf(new Date(moved.body.windowStart), london)).toEqual({ day: inDays(5), time: '14:00' });
      expect(half.status).toBe(400);
      expect(issuePaths(half.body)).toEqual(['body.date']);
      expect(cancelled.body.status).toBe('cancelled');
      expect(restored.body.status).toBe('scheduled');
    });

    it('answers a change that changes nothing with the visit as it is', async () => {
      const visit = await scheduled(reef);

      const empty = await tess.patch<VisitSummary>(visitPath(visit.id), {});
      const notCancelled = await tess.patch<VisitSummary>(visitPath(visit.id), { cancelled: false });

      expect(empty.status).toBe(200);
      expect(empty.body).toMatchObject({ id: visit.id, status: 'scheduled', windowStart: visit.windowStart });
      expect(notCancelled.status).toBe(200);
      expect(notCancelled.body.status).toBe('scheduled');
    });

    it('refuses owners (403) and answers 404 to another company', async () => {
      const visit = await scheduled(reef);

      expect((await owner.patch(visitPath(visit.id), { note: 'Mine' })).status).toBe(403);
      expect((await otherAdmin.patch(visitPath(visit.id), { note: 'Theirs' })).status).toBe(404);
      expect((await visitRow(visit.id)).note).toBeNull();
    });
  });

  describe('GET /api/visits', () => {
    it("shows a technician their own schedule, and refuses them another technician's", async () => {
      const tank = await newReef('Schedule reef');
      const mine = await scheduled(tank, { date: inDays(10) });
      const theirs = await scheduled(tank, { date: inDays(10), startTime: '13:00', endTime: '14:00' }, theo);
      const range = `from=${inDays(9)}&to=${inDays(11)}`;

      const own = await tess.get<VisitSummary[]>(`/api/visits?${range}&technicianId=me`);
      const byDefault = await tess.get<VisitSummary[]>(`/api/visits?${range}`);
      const someoneElse = await tess.get(`/api/visits?${range}&technicianId=${theoPerson.id}`);
      const adminView = await admin.get<VisitSummary[]>(`/api/visits?${range}&tankId=${tank.id}`);
      const adminOfTheo = await admin.get<VisitSummary[]>(
        `/api/visits?${range}&technicianId=${theoPerson.id}`,
      );

      expect(own.status).toBe(200);
      expect(own.body.map((v) => v.id)).toContain(mine.id);
      expect(own.body.every((v) => v.technician?.id === tessPerson.id)).toBe(true);
      expect(byDefault.body.map((v) => v.id)).not.toContain(theirs.id);
      expect(someoneElse.status).toBe(403);
      expect(adminView.body.map((v) => v.id)).toEqual([mine.id, theirs.id]);
      expect(adminOfTheo.body.map((v) => v.id)).toContain(theirs.id);
      expect(adminOfTheo.body.every((v) => v.technician?.id === theoPerson.id)).toBe(true);
    });

    it('refuses owners, a range that ends before it starts and one longer than 62 days', async () => {
      const byOwner = await owner.get(`/api/visits?from=${inDays(0)}&to=${inDays(1)}`);
      const backwards = await tess.get(`/api/visits?from=${inDays(5)}&to=${inDays(1)}`);
      const tooLong = await tess.get(`/api/visits?from=${inDays(0)}&to=${inDays(70)}`);

      expect(byOwner.status).toBe(403);
      expect(backwards.status).toBe(400);
      expect(issuePaths(backwards.body)).toEqual(['query.to']);
      expect(tooLong.status).toBe(400);
      expect(issuePaths(tooLong.body)).toEqual(['query.to']);
    });

    it("shows another company's admin none of our visits", async () => {
      await scheduled(reef, { date: inDays(2) });

      const res = await otherAdmin.get<VisitSummary[]>(`/api/visits?from=${inDays(1)}&to=${inDays(3)}`);

      expect(res.status).toBe(200);
      expect(res.body).toEqual([]);
    });
  });

  describe('repeating routine service', () => {
    it("writes visits at the tank's service interval, and keeps 09:00 on the tank's wall clock across a clock change", async () => {
      const tank = await newReef('Fortnightly reef', { serviceIntervalDays: 14 });
      // From 2 Dec 2026 the next change in London is 28 Mar 2027 (01:00 GMT → 02:00 BST, the last
      // Sunday of March, Summer Time Order 2002): that visit is 08:00Z, the one on 14 Mar 09:00Z.
      // A series starts from today, so the change is looked for far enough ahead that a visit comes before it.
      const change = nextClockChange(london, 15);
      const fortnights = Math.floor((Date.parse(change.day) - Date.parse(inDays(1))) / (14 * dayMs));
      const firstDay = isoDay(Date.parse(change.day) - fortnights * 14 * dayMs);

      const created = await schedule(tess, tank, {
        repeats: true,
        date: firstDay,
        startTime: '09:00',
        endTime: '10:00',
      });
      const around = await tess.get<VisitSummary[]>(
        `/api/visits?tankId=${tank.id}&from=${isoDay(Date.parse(change.day) - 14 * dayMs)}&to=${isoDay(Date.parse(change.day) + 14 * dayMs)}`,
      );

      expect(created.status, JSON.stringify(created.body)).toBe(201);
      expect(created.body).toMatchObject({ repeats: true, kind: 'routine' });
      expect(wallTimeOf(new Date(created.body.windowStart), london)).toEqual({
        day: firstDay,
        time: '09:00',
      });
      expect(around.status).toBe(200);
      const days = around.body.map((v) => wallTimeOf(new Date(v.windowStart), london));
      expect(days.map((d) => d.day)).toEqual([
        isoDay(Date.parse(change.day) - 14 * dayMs),
        change.day,
        isoDay(Date.parse(change.day) + 14 * dayMs),
      ]);
      expect(days.every((d) => d.time === '09:00')).toBe(true);
      expect(around.body.every((v) => v.repeats && v.technician?.id === tessPerson.id)).toBe(true);
      const [before, onTheDay] = around.body.map((v) => new Date(v.windowStart));
      expect(before!.getUTCHours() * 60).toBe(9 * 60 - change.offsetBefore);
      expect(onTheDay!.getUTCHours() * 60).toBe(9 * 60 - change.offsetAfter);
      expect(before!.getUTCHours()).not.toBe(onTheDay!.getUTCHours());
    });

    it('refuses a repeating service that starts in the past, and writes no visits', async () => {
      const tank = await newReef('Backdated reef', { serviceIntervalDays: 1 });

      const lastMonth = await schedule(tess, tank, { repeats: true, date: inDays(-30) });
      const longAgo = await schedule(tess, tank, { repeats: true, date: '1990-01-01' });

      for (const res of [lastMonth, longAgo]) {
        expect(res.status).toBe(400);
        expect(issuePaths(res.body)).toEqual(['body.date']);
      }
      expect(await stack.database.db.select().from(visits).where(eq(visits.tankId, tank.id))).toEqual([]);
    });

    it('repeats an interval that is no whole number of weeks in days', async () => {
      const tank = await newReef('Ten-day reef', { serviceIntervalDays: 10 });

      const created = await scheduled(tank, { repeats: true, date: inDays(1) });
      const listed = await tess.get<VisitSummary[]>(
        `/api/visits?tankId=${tank.id}&from=${inDays(0)}&to=${inDays(35)}`,
      );

      expect(created.repeats).toBe(true);
      expect(listed.body.map((v) => wallTimeOf(new Date(v.windowStart), london).day)).toEqual([
        inDays(1),
        inDays(11),
        inDays(21),
        inDays(31),
      ]);
    });
  });

  describe('PUT /api/visits/:visitId/report', () => {
    it('saves the working copy: the version goes up and the visit is under way', async () => {
      const visit = await scheduled(reef);

      const res = await saveReport(tess, visit.id, 0, report({ waterChange: { percent: 20, litres: 80 } }));

      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({
        id: visit.id,
        status: 'in-progress',
        version: 1,
        published: null,
        systemVolumeL: 400,
        draft: {
          tasksDone: ['glass', 'skimmer-cup'],
          waterChange: { percent: 20, litres: 80 },
          notes: 'Cleaned the glass and emptied the skimmer cup.',
          readings: [],
          nextVisit: null,
        },
      });
    });

    it('refuses a save on top of a stale version with 409 stale_version, and keeps what was stored', async () => {
      const visit = await scheduled(reef);
      await saveReport(tess, visit.id, 0, report({ notes: 'First words.' }));
      await saveReport(tess, visit.id, 1, report({ notes: 'Second words.' }));

      const stale = await saveReport(theo, visit.id, 1, report({ notes: 'Written over?' }));
      const stored = await tess.get<VisitDetail>(visitPath(visit.id));

      expect(stale.status).toBe(409);
      expect(stale.body.error.code).toBe('stale_version');
      expect(stored.body.version).toBe(2);
      expect(stored.body.draft?.notes).toBe('Second words.');
    });

    it('names each field a report gets wrong, and saves nothing', async () => {
      const visit = await scheduled(reef);
      const elsewhere = await newReef('Neighbour reef');
      const theirHeater = await addEquipmentTo(stack.database.db, elsewhere);

      const percent = await saveReport(
        tess,
        visit.id,
        0,
        report({ waterChange: { percent: 120, litres: 80 } }),
      );
      const departure = await saveReport(
        tess,
        visit.id,
        0,
        report({ arrivedAt: minutesAgo(30), departedAt: minutesAgo(45) }),
      );
      const tooMuchWater = await saveReport(
        tess,
        visit.id,
        0,
        report({ waterChange: { percent: 100, litres: 450 } }),
      );
      const boilingWater = await saveReport(
        tess,
        visit.id,
        0,
        report({
          readings: [
            { parameter: 'temperature', value: 25.6, unit: '°C', measuredAt: minutesAgo(40) },
            { parameter: 'temperature', value: 95, unit: '°C', measuredAt: minutesAgo(40) },
          ],
        }),
      );
      const wrongEquipment = await saveReport(
        tess,
        visit.id,
        0,
        report({ equipmentChecks: [{ equipmentId: theirHeater.id, state: 'ok' }] }),
      );

      expect(percent.status).toBe(400);
      expect(issuePaths(percent.body)).toEqual(['body.content.waterChange.percent']);
      expect(departure.status).toBe(400);
      expect(issuePaths(departure.body)).toEqual(['body.content.departedAt']);
      expect(tooMuchWater.status).toBe(400);
      expect(issuePaths(tooMuchWater.body)).toEqual(['body.content.waterChange.litres']);
      expect(tooMuchWater.body.error.issues![0]!.message).toContain('400 L');
      expect(boilingWater.status).toBe(400);
      expect(issuePaths(boilingWater.body)).toHaveLength(1);
      expect(issuePaths(boilingWater.body)[0]).toMatch(/^body\.content\.readings\.1\./);
      expect(wrongEquipment.status).toBe(400);
      expect(issuePaths(wrongEquipment.body)).toEqual(['body.content.equipmentChecks.0.equipmentId']);
      const row = await visitRow(visit.id);
      expect(row).toMatchObject({ version: 0, status: 'scheduled', draft: null });
    });

    it('names an unknown species against its place in the report', async () => {
      const visit = await scheduled(reef);

      const res = await saveReport(
        tess,
        visit.id,
        0,
        report({ livestockChanges: [{ action: 'add', speciesId: 'no-such-fish', quantity: 1 }] }),
      );

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.content.livestockChanges.0.speciesId']);
      expect((await visitRow(visit.id)).status).toBe('scheduled');
    });

    it('accepts a check of the tank’s own equipment', async () => {
      const visit = await scheduled(reef);
      const heater = await addEquipmentTo(stack.database.db, reef);

      const res = await saveReport(
        tess,
        visit.id,
        0,
        report({
          equipmentChecks: [{ equipmentId: heater.id, state: 'needs-attention', note: 'Seal worn.' }],
        }),
      );

      expect(res.status).toBe(200);
      expect(res.body.draft?.equipmentChecks).toEqual([
        { equipmentId: heater.id, state: 'needs-attention', note: 'Seal worn.' },
      ]);
    });

    it('refuses owners (403), another company (404), and a cancelled visit (409)', async () => {
      const visit = await scheduled(reef);
      const cancelled = await scheduled(reef);
      await tess.patch(visitPath(cancelled.id), { cancelled: true });

      expect((await saveReport(owner, visit.id, 0, report())).status).toBe(403);
      expect((await saveReport(otherAdmin, visit.id, 0, report())).status).toBe(404);
      const onCancelled = await saveReport(tess, cancelled.id, 0, report());
      expect(onCancelled.status).toBe(409);
      expect(onCancelled.body.error.code).toBe('visit_cancelled');
      expect((await visitRow(visit.id)).version).toBe(0);
    });
  });

  describe('what owners see', () => {
    it('hides drafts and the schedule from owners: only published reports, and the next visit', async () => {
      const tank = await newReef('Private reef');
      // Both visits were yesterday, so the next visit is the one planned for next week.
      const draft = await scheduled(tank, { date: inDays(-1) });
      await saveReport(tess, draft.id, 0, report({ notes: 'Half written.' }));
      const done = await scheduled(tank, { date: inDays(-1), startTime: '07:00', endTime: '08:00' });
      await savedAndPublished(done.id, report({ notes: 'All done.' }));
      const upcoming = await scheduled(tank, { date: inDays(7) });

      const draftForOwner = await owner.get(visitPath(draft.id));
      const doneForOwner = await owner.get<VisitDetail>(visitPath(done.id));
      const ownerList = await owner.get<TankVisits>(`/api/tanks/${tank.id}/visits`);
      const staffList = await tess.get<TankVisits>(`/api/tanks/${tank.id}/visits`);

      expect(draftForOwner.status).toBe(404);
      expect(doneForOwner.status).toBe(200);
      expect(doneForOwner.body).toMatchObject({
        draft: null,
        carriedItems: [],
        published: { notes: 'All done.' },
      });
      expect(ownerList.status).toBe(200);
      expect(ownerList.body.visits.map((v) => v.id)).toEqual([done.id]);
      expect(ownerList.body.openItems).toEqual([]);
      expect(ownerList.body.next?.id).toBe(upcoming.id);
      expect(staffList.body.visits.map((v) => v.id).sort()).toEqual([draft.id, done.id, upcoming.id].sort());
    });

    it('answers 404 to an owner not on the tank and to another company, for the visit and the tank list', async () => {
      const visit = await scheduled(reef);
      await savedAndPublished(visit.id, report());

      expect((await otherOwner.get(visitPath(visit.id))).status).toBe(404);
      expect((await otherOwner.get(`/api/tanks/${reef.id}/visits`)).status).toBe(404);
      expect((await otherAdmin.get(visitPath(visit.id))).status).toBe(404);
      expect((await otherAdmin.get(`/api/tanks/${reef.id}/visits`)).status).toBe(404);
      expect((await otherAdmin.get(visitPath(visit.id, '/versions/1'))).status).toBe(404);
    });
  });

  describe('POST /api/visits/:visitId/publish', () => {
    it('stores the readings as visit readings and opens an alert exactly as the readings route would', async () => {
      const tank = await newReef('Warm reef');
      const twin = await newReef('Warm twin');
      const visit = await scheduled(tank);
      const measuredAt = minutesAgo(40);
      const hot = { parameter: 'temperature', value: 29.6, unit: '°C', measuredAt } as const;

      const published = await savedAndPublished(visit.id, report({ readings: [hot] }));
      const byRoute = await tess.post(`/api/tanks/${twin.id}/readings`, { readings: [hot], source: 'visit' });
      const history = await owner.get<ReadingHistory>(
        `/api/tanks/${tank.id}/readings?parameter=temperature&from=${encodeURIComponent(minutesAgo(120))}&to=${encodeURIComponent(minutesAgo(0))}`,
      );
      const alertsOf = async (id: string) => (await tess.get<Alert[]>(`/api/alerts?tankId=${id}`)).body;
      const fromVisit = await alertsOf(tank.id);
      const fromRoute = await alertsOf(twin.id);

      expect(published).toMatchObject({
        status: 'published',
        publishedBy: { id: tessPerson.id, name: 'Tess Tech' },
        published: { readings: [hot] },
      });
      expect(published.publishedAt).not.toBeNull();
      expect(byRoute.status).toBe(201);
      expect(history.status).toBe(200);
      expect(history.body.readings).toEqual([
        expect.objectContaining({
          value: 29.6,
          source: 'visit',
          measuredAt: new Date(measuredAt).toISOString(),
        }),
      ]);
      const comparable = (alert: Alert) => ({
        kind: alert.kind,
        parameter: alert.parameter,
        severity: alert.severity,
        status: alert.status,
        value: alert.value,
        limitValue: alert.limitValue,
        direction: alert.direction,
        body: alert.body,
      });
      expect(fromVisit).toHaveLength(1);
      expect(fromVisit.map(comparable)).toEqual(fromRoute.map(comparable));
      expect(fromVisit[0]).toMatchObject({ kind: 'limit', severity: 'critical', parameter: 'temperature' });
    });

    it('refuses an addition with unacknowledged compatibility warnings and writes nothing at all', async () => {
      const tank = await newReef('Anemone reef');
      await addLivestockTo(stack.database.db, tank, { catalogueSpeciesId: 'hammer-coral' });
      const visit = await scheduled(tank);
      const content = report({
        readings: [{ parameter: 'temperature', value: 25.8, unit: '°C', measuredAt: minutesAgo(40) }],
        livestockChanges: [{ action: 'add', speciesId: 'bubble-tip-anemone', quantity: 1 }],
        nextItems: ['Check the anemone has settled'],
      });
      const saved = await saveReport(tess, visit.id, 0, content);

      const refused = await publish(tess, visit.id, saved.body.version);

      expect(refused.status).toBe(400);
      expect(issuePaths(refused.body)).toEqual(['body.content.livestockChanges.0.acknowledgeWarnings']);
      expect(refused.body.error.issues![0]!.message).toMatch(/bubble-tip anemone/i);
      const { db } = stack.database;
      expect(await db.select().from(readings).where(eq(readings.tankId, tank.id))).toEqual([]);
      expect(await db.select().from(livestock).where(eq(livestock.tankId, tank.id))).toHaveLength(1);
      expect(await visitRow(visit.id)).toMatchObject({
        status: 'in-progress',
        published: null,
        publishedAt: null,
      });
      expect((await db.select().from(tanks).where(eq(tanks.id, tank.id)))[0]!.lastVisitAt).toBeNull();
      expect((await tess.get<TankVisits>(`/api/tanks/${tank.id}/visits`)).body.openItems).toEqual([]);

      const accepted = await savedAndPublished(visit.id, {
        ...content,
        livestockChanges: [
          { action: 'add', speciesId: 'bubble-tip-anemone', quantity: 1, acknowledgeWarnings: true },
        ],
      });
      expect(accepted.status).toBe('published');
      expect(await db.select().from(livestock).where(eq(livestock.tankId, tank.id))).toHaveLength(2);
    });

    it('adds, removes and moves livestock, each with its line of history', async () => {
      const tank = await newReef('Busy reef');
      const chromis = await addLivestockTo(stack.database.db, tank, {
        catalogueSpeciesId: 'green-chromis',
        quantity: 3,
      });
      const zoas = await addLivestockTo(stack.database.db, tank, {
        catalogueSpeciesId: 'zoanthids',
        placement: 'left rock',
      });
      const visit = await scheduled(tank);
      const arrivedAt = minutesAgo(60);

      await savedAndPublished(
        visit.id,
        report({
          arrivedAt,
          livestockChanges: [
            { action: 'add', speciesId: 'trochus-snail', quantity: 4, placement: 'glass' },
            { action: 'remove', livestockId: chromis.id, note: 'Taken back to the shop.' },
            { action: 'move', livestockId: zoas.id, placement: 'top of the right rock' },
          ],
        }),
      );
      const listed = await owner.get<LivestockItem[]>(`/api/tanks/${tank.id}/livestock`);
      const byId = (id: string) => listed.body.find((item) => item.id === id)!;
      const snail = listed.body.find((item) => item.species.id === 'trochus-snail');

      expect(listed.status).toBe(200);
      expect(snail).toMatchObject({
        quantity: 4,
        placement: 'glass',
        status: 'stable',
        addedOn: wallTimeOf(new Date(arrivedAt), london).day,
        history: [{ status: 'stable', changedBy: { name: 'Tess Tech' } }],
      });
      expect(snail!.history[0]!.note).toMatch(/visit/);
      expect(byId(chromis.id)).toMatchObject({ status: 'removed' });
      expect(byId(chromis.id).history[0]).toMatchObject({
        status: 'removed',
        note: 'Taken back to the shop.',
        changedAt: new Date(arrivedAt).toISOString(),
        changedBy: { name: 'Tess Tech' },
      });
      expect(byId(zoas.id)).toMatchObject({ placement: 'top of the right rock', status: 'stable' });
    });

    it("carries next time's items to the next report until a report ticks them off", async () => {
      const tank = await newReef('Checklist reef');
      const first = await scheduled(tank, { date: inDays(0), startTime: '07:00', endTime: '08:00' });
      const second = await scheduled(tank, { date: inDays(0), startTime: '12:00', endTime: '13:00' });
      const third = await scheduled(tank, { date: inDays(1) });
      await savedAndPublished(
        first.id,
        report({ nextItems: ['Replace the heater', 'Refill the kalkwasser'] }),
      );

      const carried = await tess.get<VisitDetail>(visitPath(second.id));
      const [heater, kalk] = carried.body.carriedItems;
      await savedAndPublished(second.id, report({ closedItemIds: [heater!.id] }));
      const afterTick = await tess.get<VisitDetail>(visitPath(third.id));
      const ticker = await tess.get<VisitDetail>(visitPath(second.id));
      const tankList = await tess.get<TankVisits>(`/api/tanks/${tank.id}/visits`);

      expect(carried.body.carriedItems).toMatchObject([
        { text: 'Replace the heater', fromVisitId: first.id, closedAt: null, closedInVisitId: null },
        { text: 'Refill the kalkwasser', fromVisitId: first.id, closedAt: null },
      ]);
      expect(afterTick.body.carriedItems.map((item) => item.id)).toEqual([kalk!.id]);
      expect(ticker.body.carriedItems).toMatchObject([
        { id: heater!.id, closedInVisitId: second.id },
        { id: kalk!.id, closedAt: null },
      ]);
      expect(ticker.body.carriedItems[0]!.closedAt).not.toBeNull();
      expect(tankList.body.openItems.map((item) => item.text)).toEqual(['Refill the kalkwasser']);
    });

    it('refuses to tick an item that is not open on the tank', async () => {
      const visit = await scheduled(reef);

      const res = await saveReport(
        tess,
        visit.id,
        0,
        report({ closedItemIds: ['0b6f1c7e-4a8d-4e0b-9b1f-3c2d5e6f7a8b'] }),
      );

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.content.closedItemIds.0']);
    });

    it("moves the tank's next scheduled visit to the time the report names, and records the last visit", async () => {
      const tank = await newReef('Planned reef');
      const visit = await scheduled(tank);
      const later = await scheduled(tank, { date: inDays(10) });
      const arrivedAt = minutesAgo(60);

      await savedAndPublished(
        visit.id,
        report({ arrivedAt, nextVisit: { date: inDays(14), startTime: '14:00', endTime: '15:30' } }),
      );
      const moved = await tess.get<VisitDetail>(visitPath(later.id));
      const list = await owner.get<TankVisits>(`/api/tanks/${tank.id}/visits`);

      expect(wallTimeOf(new Date(moved.body.windowStart), london)).toEqual({
        day: inDays(14),
        time: '14:00',
      });
      expect(wallTimeOf(new Date(moved.body.windowEnd), london)).toEqual({ day: inDays(14), time: '15:30' });
      expect(list.body.next?.id).toBe(later.id);
      expect(list.body.lastVisitAt).toBe(new Date(arrivedAt).toISOString());
      expect(await stack.database.db.select().from(visits).where(eq(visits.tankId, tank.id))).toHaveLength(2);
    });

    it('plans the next visit when none is scheduled, with the same technician', async () => {
      const tank = await newReef('Unplanned reef');
      const visit = await scheduled(tank);

      await savedAndPublished(
        visit.id,
        report({ nextVisit: { date: inDays(21), startTime: '10:00', endTime: '11:00' } }),
      );
      const list = await tess.get<TankVisits>(`/api/tanks/${tank.id}/visits`);

      expect(list.body.next).toMatchObject({
        kind: 'routine',
        status: 'scheduled',
        technician: { id: tessPerson.id },
      });
      expect(wallTimeOf(new Date(list.body.next!.windowStart), london)).toEqual({
        day: inDays(21),
        time: '10:00',
      });
    });

    it("tells the tank's owners in the app, and by e-mail only those whose preference asks for it", async () => {
      const { db } = stack.database;
      const issuer = stack.idp.issuer;
      const emailed = await signedIn(stack, await createPerson(db, { companyId, role: 'owner', issuer }));
      const appOnly = await signedIn(stack, await createPerson(db, { companyId, role: 'owner', issuer }));
      const preferences = (visitReports: string[]) => ({
        push: ['critical'],
        email: ['critical'],
        inApp: ['notice', 'warning', 'critical'],
        quietHours: null,
        timeZone: london,
        visitReports,
      });
      expect(
        (await emailed.put('/api/notifications/preferences', preferences(['in-app', 'email']))).status,
      ).toBe(200);
      expect((await appOnly.put('/api/notifications/preferences', preferences(['in-app']))).status).toBe(200);
      const tank = await newReef('Newsworthy reef', { owners: [emailed.person, appOnly.person] });
      const visit = await scheduled(tank);

      await savedAndPublished(visit.id, report({ waterChange: { percent: 20, litres: 80 } }));
      // Planning again (a retried job, the sweep) tells nobody twice.
      await fanOutVisitReport(stack.deps, visit.id);
      type Inbox = { items: { title: string; body: string; link: string; severity: string }[] };
      const emailedInbox = await emailed.get<Inbox>('/api/notifications');
      const appOnlyInbox = await appOnly.get<Inbox>('/api/notifications');
      const planned = await db.select().from(deliveries).where(eq(deliveries.visitId, visit.id));

      const expected = {
        severity: 'notice',
        title: 'Visit report: Newsworthy reef',
        link: `/tanks/${tank.id}?section=visits&visit=${visit.id}`,
      };
      expect(emailedInbox.body.items).toEqual([expect.objectContaining(expected)]);
      expect(emailedInbox.body.items[0]!.body).toContain('Tess Tech visited on');
      expect(emailedInbox.body.items[0]!.body).toContain('Water change 20 % (80 L)');
      expect(appOnlyInbox.body.items).toEqual([expect.objectContaining(expected)]);
      expect(planned.map((d) => [d.channel, d.destination])).toEqual([['email', emailed.person.email]]);
      expect((await visitRow(visit.id)).announcedAt).not.toBeNull();

      await deliverEmail(stack.deps, planned[0]!.id);
      const mail = await stack.mail.waitFor((m) => m.to.includes(emailed.person.email), 30_000);
      expect(mail.subject).toBe('Visit report: Newsworthy reef');
      expect(mail.text).toContain(`${stack.origin}/tanks/${tank.id}?section=visits&visit=${visit.id}`);
      expect(mail.headers['list-unsubscribe']).toBe(`<${stack.origin}/settings/notifications>`);
      const [sent] = await db.select().from(deliveries).where(eq(deliveries.id, planned[0]!.id));
      expect(sent!.status).toBe('sent');
      expect(stack.mail.messages().filter((m) => m.to.includes(appOnly.person.email))).toEqual([]);
    });

    it("puts the report's notes in the e-mail: rendered HTML and plain text, links absolute, no images", async () => {
      const { db } = stack.database;
      const owner = await signedIn(
        stack,
        await createPerson(db, { companyId, role: 'owner', issuer: stack.idp.issuer }),
      );
      expect(
        (
          await owner.put('/api/notifications/preferences', {
            push: ['critical'],
            email: ['critical'],
            inApp: ['notice', 'warning', 'critical'],
            quietHours: null,
            timeZone: london,
            visitReports: ['email'],
          })
        ).status,
      ).toBe(200);
      const tank = await newReef('Annotated reef', { owners: [owner.person] });
      const visit = await scheduled(tank);
      const photo = '0b9f6a1e-6c3a-4c35-9a59-2f7d0f3b1a11';
      const notes = [
        'Trimmed the **green star polyps**.',
        '',
        '::: caution',
        'Unplug the heater before you reach in.',
        ':::',
        '',
        `See [the readings](/tanks/${tank.id}?section=readings) and ![After the visit](/api/photos/${photo}).`,
        '<script>alert(1)</script>',
      ].join('\n');

      await savedAndPublished(visit.id, report({ notes }));
      const [planned] = await db.select().from(deliveries).where(eq(deliveries.visitId, visit.id));
      await deliverEmail(stack.deps, planned!.id);
      const mail = await stack.mail.waitFor((m) => m.to.includes(owner.person.email), 30_000);

      const readingsLink = `${stack.origin}/tanks/${tank.id}?section=readings`;
      expect(mail.html).toContain('<p>Trimmed the <strong>green star polyps</strong>.</p>');
      expect(mail.html).toContain('<aside class="md-caution" role="note" aria-label="Caution">');
      expect(mail.html).toContain(
        `<a href="${readingsLink}" rel="noopener nofollow ugc" target="_blank">the readings</a> and After the visit.`,
      );
      expect(mail.html).not.toContain('<img');
      expect(mail.html).not.toContain('<script');
      expect(mail.html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
      expect(mail.text).toContain(
        [
          'Notes:',
          '',
          'Trimmed the green star polyps.',
          '',
          'Caution: Unplug the heater before you reach in.',
          '',
          `See the readings (${readingsLink}) and After the visit.`,
          '<script>alert(1)</script>',
        ].join('\n'),
      );
    });

    it('sends the e-mail in quiet hours and plans the push for when they end', async () => {
      const { db } = stack.database;
      const issuer = stack.idp.issuer;
      const sleeper = await signedIn(stack, await createPerson(db, { companyId, role: 'owner', issuer }));
      const clock = (offsetMin: number) => wallTimeOf(new Date(Date.now() + offsetMin * 60_000), london).time;
      // Quiet from an hour ago to an hour from now, on the owner's own clock.
      const saved = await sleeper.put('/api/notifications/preferences', {
        push: ['critical'],
        email: ['critical'],
        inApp: ['notice', 'warning', 'critical'],
        quietHours: { start: clock(-60), end: clock(60) },
        timeZone: london,
        visitReports: ['in-app', 'email', 'push'],
      });
      expect(saved.status).toBe(200);
      await db.insert(pushSubscriptions).values({
        userId: sleeper.person.id,
        endpoint: `https://push.example.test/${sleeper.person.id}`,
        p256dh: 'B'.repeat(87),
        auth: 'A'.repeat(22),
      });
      const tank = await newReef('Night reef', { owners: [sleeper.person] });
      const visit = await scheduled(tank);

      await savedAndPublished(visit.id, report({ notes: 'All well.' }));
      const planned = await db.select().from(deliveries).where(eq(deliveries.visitId, visit.id));

      expect(planned.map((d) => d.channel).sort()).toEqual(['email', 'push']);
    });

    it('keeps the earlier text as a version when a published report is edited, and marks it edited', async () => {
      const tank = await newReef('Edited reef');
      const visit = await scheduled(tank);
      const reading = {
        parameter: 'temperature',
        value: 25.9,
        unit: '°C',
        measuredAt: minutesAgo(40),
      } as const;
      const content = report({ readings: [reading], notes: 'Cleaned the glass.' });
      const first = await savedAndPublished(visit.id, content);

      const edited = await saveReport(tess, visit.id, first.version, {
        ...content,
        notes: 'Cleaned the glass and the overflow.',
      });
      const ownerBeforeRepublish = await owner.get<VisitDetail>(visitPath(visit.id));
      const republished = await publish(tess, visit.id, edited.body.version);
      const ownerView = await owner.get<VisitDetail>(visitPath(visit.id));
      const earlier = await owner.get<VisitReportContent>(visitPath(visit.id, `/versions/${first.version}`));
      const missing = await owner.get(visitPath(visit.id, '/versions/99'));
      const changedReadings = await saveReport(tess, visit.id, republished.body.version, {
        ...content,
        readings: [{ ...reading, value: 26.4 }],
      });
      const { db } = stack.database;

      expect(first.editedAt).toBeNull();
      expect(edited.status).toBe(200);
      expect(ownerBeforeRepublish.body.published?.notes).toBe('Cleaned the glass.');
      expect(republished.status).toBe(200);
      expect(ownerView.body).toMatchObject({
        published: { notes: 'Cleaned the glass and the overflow.' },
        earlierVersions: [{ version: first.version, publishedAt: first.publishedAt }],
        publishedAt: first.publishedAt,
      });
      expect(ownerView.body.editedAt).not.toBeNull();
      expect(earlier.status).toBe(200);
      expect(earlier.body.notes).toBe('Cleaned the glass.');
      expect(missing.status).toBe(404);
      expect(changedReadings.status).toBe(400);
      expect(issuePaths(changedReadings.body)).toEqual(['body.content.readings']);
      expect(await db.select().from(readings).where(eq(readings.tankId, tank.id))).toHaveLength(1);
      expect(
        await db
          .select()
          .from(notifications)
          .where(and(eq(notifications.visitId, visit.id), eq(notifications.userId, ownerPerson.id))),
      ).toHaveLength(1);
    });

    it('answers a repeated publish of the same version with the report as it is, and still publishes a later edit', async () => {
      const visit = await scheduled(reef);
      const first = await savedAndPublished(visit.id, report({ notes: 'Fed the fish.' }));

      const again = await publish(tess, visit.id, first.version);
      const edited = await saveReport(
        tess,
        visit.id,
        first.version,
        report({ notes: 'Fed the fish and the corals.' }),
      );
      const republished = await publish(tess, visit.id, edited.body.version);

      expect(again.status).toBe(200);
      expect(again.body).toMatchObject({
        editedAt: null,
        earlierVersions: [],
        published: { notes: 'Fed the fish.' },
      });
      expect(republished.status, JSON.stringify(republished.body)).toBe(200);
      expect(republished.body).toMatchObject({
        published: { notes: 'Fed the fish and the corals.' },
        earlierVersions: [{ version: first.version }],
      });
    });

    it('refuses an arrival, a departure or a reading in the future, and publishes nothing', async () => {
      const tank = await newReef('Time-travel reef');
      const visit = await scheduled(tank);
      const tomorrow = new Date(Date.now() + dayMs).toISOString();
      const saved = await saveReport(
        tess,
        visit.id,
        0,
        report({
          arrivedAt: tomorrow,
          departedAt: tomorrow,
          readings: [{ parameter: 'temperature', value: 25.5, unit: '°C', measuredAt: tomorrow }],
        }),
      );

      const res = await publish(tess, visit.id, saved.body.version);

      expect(saved.status).toBe(200);
      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual([
        'body.content.arrivedAt',
        'body.content.departedAt',
        'body.content.readings.0.measuredAt',
      ]);
      expect((await visitRow(visit.id)).status).toBe('in-progress');
      expect(await stack.database.db.select().from(readings).where(eq(readings.tankId, tank.id))).toEqual([]);
      expect(
        (await stack.database.db.select().from(tanks).where(eq(tanks.id, tank.id)))[0]!.lastVisitAt,
      ).toBeNull();
    });

    it('refuses a stale version (409), an empty report, a report without an arrival, owners and strangers', async () => {
      const visit = await scheduled(reef);
      const empty = await publish(tess, visit.id, 0);
      await saveReport(tess, visit.id, 0, report({ arrivedAt: null, departedAt: null }));

      const stale = await publish(tess, visit.id, 0);
      const noArrival = await publish(tess, visit.id, 1);
      const byOwner = await publish(owner, visit.id, 1);
      const byStranger = await publish(otherAdmin, visit.id, 1);

      expect(empty.status).toBe(400);
      expect(stale.status).toBe(409);
      expect(stale.body.error.code).toBe('stale_version');
      expect(noArrival.status).toBe(400);
      expect(issuePaths(noArrival.body)).toEqual(['body.content.arrivedAt']);
      expect(byOwner.status).toBe(403);
      expect(byStranger.status).toBe(404);
      expect((await visitRow(visit.id)).status).toBe('in-progress');
    });

    it('refuses to move or cancel a visit whose report is published', async () => {
      const visit = await scheduled(reef);
      await savedAndPublished(visit.id, report());

      const res = await tess.patch(visitPath(visit.id), { cancelled: true });

      expect(res.status).toBe(409);
      expect((await visitRow(visit.id)).status).toBe('published');
    });
  });

  describe('visit photos', () => {
    let png: Buffer;
    beforeAll(async () => {
      png = await makeImage({ width: 64, height: 48, format: 'png' });
    });

    const uploadVisitPhoto = async (tank: { id: string }) => {
      const form = new FormData();
      form.append('subject', 'visit');
      form.append('photo', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'after.png');
      const res = await tess.upload<PhotoItem>(`/api/tanks/${tank.id}/photos`, form);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      return res.body;
    };
    const ownerSees = async (tank: { id: string }, photo: { id: string }) => {
      const list = await owner.get<PhotoItem[]>(`/api/tanks/${tank.id}/photos`);
      expect(list.status, JSON.stringify(list.body)).toBe(200);
      return {
        direct: (await owner.get(`/api/photos/${photo.id}`)).status,
        listed: list.body.some((p) => p.id === photo.id),
      };
    };

    it('keeps a visit photo from the owner until a published report uses it', async () => {
      const tank = await newReef('Photogenic reef');
      const visit = await scheduled(tank);
      const before = await uploadVisitPhoto(tank);
      const after = await uploadVisitPhoto(tank);

      const uploaded = await ownerSees(tank, after);
      const staffSees = (await tess.get(`/api/photos/${after.id}`)).status;
      const saved = await saveReport(
        tess,
        visit.id,
        0,
        report({
          photos: [
            { photoId: before.id, phase: 'before' },
            { photoId: after.id, phase: 'after' },
          ],
        }),
      );
      const inDraft = await ownerSees(tank, after);
      const dropped = await saveReport(
        tess,
        visit.id,
        1,
        report({ photos: [{ photoId: after.id, phase: 'after' }] }),
      );
      await publish(tess, visit.id, dropped.body.version);
      const published = await ownerSees(tank, after);
      const leftOut = await ownerSees(tank, before);

      expect(uploaded).toEqual({ direct: 404, listed: false });
      expect(staffSees).toBe(200);
      expect(saved.status, JSON.stringify(saved.body)).toBe(200);
      expect(inDraft).toEqual({ direct: 404, listed: false });
      expect(dropped.status, JSON.stringify(dropped.body)).toBe(200);
      expect(published).toEqual({ direct: 200, listed: true });
      expect(leftOut).toEqual({ direct: 404, listed: false });
    });

    it('refuses a photo of another tank in a report', async () => {
      const visit = await scheduled(reef);
      const elsewhere = await newReef('Camera-shy reef');
      const theirs = await uploadVisitPhoto(elsewhere);

      const res = await saveReport(
        tess,
        visit.id,
        0,
        report({ photos: [{ photoId: theirs.id, phase: 'after' }] }),
      );

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.content.photos.0.photoId']);
    });
  });
});

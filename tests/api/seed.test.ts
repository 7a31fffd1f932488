import { and, asc, desc, eq, isNotNull, sql } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findSpecies } from '@shared/livestock/catalogue';
import { checkCompatibility } from '@shared/livestock/compatibility';
import { tankStyleWaterType } from '@shared/parameters/limit-templates';
import { addDays, equipmentInput } from '@shared/schemas/equipment';
import { careTipInput } from '@shared/schemas/care-tips';
import { visitReportContent } from '@shared/schemas/visits';
import { routineRule, wallTimeOf } from '@shared/visits/recurrence';
import { demoId, demoLivestockId, seedDemo } from '../../api/dev/seed/index';
import { demoEquipment, demoLivestock, demoTanks } from '../../api/dev/seed/scenario';
import { demoVisitId, demoVisitSeriesId } from '../../api/dev/seed/visits';
import {
  careTips,
  deliveries,
  livestock,
  livestockStatusEvents,
  notifications,
  tanks,
  users,
  visitItems,
  visits,
  visitSeries,
} from '../../api/db/schema/index';
import { findActiveActor, type Actor } from '../../api/services/actors';
import { listTanks } from '../../api/services/tanks';
import { getVisit, getVisitVersion, listSchedule, tankVisits } from '../../api/services/visits';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { startTestStorage, type TestStorage } from './photos/test-storage';

describe('demo seed', () => {
  let database: TestDatabase;
  let s3: TestStorage;
  beforeAll(async () => {
    database = await createTestDatabase();
    s3 = await startTestStorage();
  });
  afterAll(async () => {
    await database.drop();
    await s3.close();
  });

  const counts = async () => {
    const result = await database.db.execute<Record<string, number>>(
      sql`select (select count(*)::int from companies) as companies, (select count(*)::int from users) as users,
                 (select count(*)::int from tanks) as tanks, (select count(*)::int from tank_members) as members,
                 (select count(*)::int from equipment) as equipment, (select count(*)::int from livestock) as livestock,
                 (select count(*)::int from livestock_status_events) as events,
                 (select count(*)::int from photos) as photos,
                 (select count(*)::int from tanks where cover_photo_id is not null) as covers,
                 (select count(*)::int from visits) as visits,
                 (select count(*)::int from visits where status = 'published') as reports,
                 (select count(*)::int from visit_series) as series,
                 (select count(*)::int from visit_items) as items,
                 (select count(*)::int from visit_report_versions) as versions,
                 (select count(*)::int from visit_photos) as "visitPhotos",
                 (select count(*)::int from care_tips) as tips,
                 (select count(*)::int from care_tips where status = 'scheduled') as "scheduledTips",
                 (select count(*)::int from care_tip_tanks) as "tipTanks",
                 (select count(*)::int from care_tip_readers) as "tipReaders",
                 (select count(*)::int from care_tip_helpful) as "helpfulMarks"`,
    );
    return result.rows[0];
  };

  it('writes the demo scenario, and running it again changes nothing', async () => {
    await seedDemo(database.db, { issuer: 'http://127.0.0.1:3001', storage: s3.storage });
    const first = await counts();
    const photoKeys = await database.db.execute(sql`select object_key from photos order by id`);
    await seedDemo(database.db, { issuer: 'http://127.0.0.1:3001', storage: s3.storage });

    expect(first).toEqual({
      companies: 2,
      users: 8,
      tanks: 5,
      members: 5,
      equipment: 40,
      livestock: 38,
      // The scenario's 53 status changes and the anemone's removal at a visit.
      events: 54,
      photos: 21,
      covers: 5,
      // 43 published reports, 2 cancelled visits, 8 planned ones and 4 weeks of the lagoon's series.
      visits: 57,
      reports: 43,
      series: 1,
      items: 9,
      versions: 1,
      // Each tank's latest report shows its cover photo; the anemone's report its portrait too.
      visitPhotos: 6,
      // Five tips sent over past months (to 3, 1, 5, 5 and 1 tanks, each with one owner) and one to come.
      tips: 6,
      scheduledTips: 1,
      tipTanks: 15,
      tipReaders: 15,
      helpfulMarks: 4,
    });
    expect(await counts()).toEqual(first);
    // The photos were drawn once; the second run found them in storage.
    expect((await database.db.execute(sql`select object_key from photos order by id`)).rows).toEqual(
      photoKeys.rows,
    );
    // A year of device readings (about 840,000 rows) twice over; took about 50 s on a loaded 2-core
    // machine, so this bounds a hang, not the speed.
  }, 300_000);

  it('stores each photo as a re-encoded WebP the API can serve', async () => {
    const cover = demoId('photo:ashdown-reef:cover');
    const [row] = (
      await database.db.execute<{ object_key: string; width: number }>(
        sql`select object_key, width from photos where id = ${cover}`,
      )
    ).rows;
    const object = await s3.storage.get(row!.object_key);
    const chunks: Buffer[] = [];
    for await (const chunk of object!.body) chunks.push(chunk as Buffer);

    expect(await sharp(Buffer.concat(chunks)).metadata()).toMatchObject({
      format: 'webp',
      width: row!.width,
    });
  });

  it('keeps to the catalogue, valid equipment and a story with a compatibility tension', () => {
    for (const tank of demoTanks) {
      for (const animal of demoLivestock[tank.key])
        expect(findSpecies(animal.speciesId), animal.speciesId).toBeDefined();
      for (const item of demoEquipment[tank.key]) {
        const { key: _key, installedDaysAgo: _i, lastServicedDaysAgo: _l, ...fields } = item;
        expect(equipmentInput.safeParse(fields).success, item.key).toBe(true);
      }
    }
    const reef = demoLivestock['ashdown-reef'].filter((animal) => animal.key !== 'anemone');
    const warnings = checkCompatibility(
      findSpecies('bubble-tip-anemone')!,
      reef.map((animal) => ({ species: findSpecies(animal.speciesId)! })),
      { waterType: 'marine' },
    );
    expect(warnings.map((warning) => warning.kind)).toContain('stings-neighbours');
  });

  it('writes care tips staff could have written, with the electrical cautions, and sends none at seed time', async () => {
    const rows = await database.db.select().from(careTips).orderBy(asc(careTips.createdAt));
    for (const row of rows)
      expect([row.title, careTipInput.safeParse(row).success]).toEqual([row.title, true]);
    const electrical = rows.filter((row) => /wall|socket/i.test(row.title));
    expect(electrical).toHaveLength(2);
    for (const row of electrical) {
      expect(row.body).toContain('::: caution');
      expect(row.body).toContain('licensed electrician');
    }
    const scheduled = rows.filter((row) => row.status === 'scheduled');
    expect(scheduled.map((row) => row.sendAt!.getTime() > Date.now())).toEqual([true]);
    // Past tips were told when they went out; nothing is planned for them now.
    expect(await database.db.select().from(notifications).where(isNotNull(notifications.tipId))).toEqual([]);
    expect(await database.db.select().from(deliveries).where(isNotNull(deliveries.tipId))).toEqual([]);
  });
  describe('service visits', () => {
    const dayMs = 86_400_000;
    const london = 'Europe/London';
    const deps = () => ({ db: database.db, clock: () => new Date() });
    const actor = async (subject: string): Promise<Actor> => {
      const [row] = await database.db.select({ id: users.id }).from(users).where(eq(users.subject, subject));
      return (await findActiveActor(database.db, row!.id))!;
    };
    const publishedOn = (tankKey: string) =>
      database.db
        .select()
        .from(visits)
        .where(and(eq(visits.tankId, demoId(tankKey)), eq(visits.status, 'published')))
        .orderBy(asc(visits.windowStart));

    it('publishes complete reports on every tank, by its technician, at its service interval', async () => {
      for (const tank of demoTanks) {
        const technician = await actor(tank.technician);
        const rows = await publishedOn(tank.key);
        const equipmentIds = new Set(
          demoEquipment[tank.key].map((item) => demoId(`equipment:${tank.key}:${item.key}`)),
        );
        const systemL = tank.displayVolumeL + tank.sumpVolumeL;
        const marine = tankStyleWaterType[tank.style] === 'marine';
        expect([tank.key, rows.length >= 5]).toEqual([tank.key, true]);

        const arrivals: number[] = [];
        for (const row of rows) {
          const report = visitReportContent.parse(row.published);
          expect(report).toEqual(visitReportContent.parse(row.draft));
          expect({ by: row.publishedBy, technician: row.technicianId }).toEqual({
            by: technician.id,
            technician: technician.id,
          });
          // Announced when published, so seeding sends nothing.
          expect(row.announcedAt).not.toBeNull();
          expect(row.publishedVersion).toBe(row.version);
          const [arrived, departed] = [Date.parse(report.arrivedAt!), Date.parse(report.departedAt!)];
          expect(departed).toBeGreaterThan(arrived);
          expect(row.publishedAt!.getTime()).toBeGreaterThanOrEqual(departed);
          expect(report.tasksDone.length).toBeGreaterThan(0);
          expect(report.notes.trim().length).toBeGreaterThan(0);
          if (report.waterChange) {
            expect(report.waterChange.litres).toBeCloseTo((systemL * report.waterChange.percent) / 100, 1);
            expect([tank.key, report.waterChange.newSalinityPpt != null]).toEqual([tank.key, marine]);
            expect(report.tasksDone).toContain('water-change');
          }
          for (const check of report.equipmentChecks) expect(equipmentIds.has(check.equipmentId)).toBe(true);
          // A report that says the water was tested lists readings stored from that visit.
          expect(report.tasksDone.includes('water-test')).toBe(report.readings.length > 0);
          for (const reading of report.readings) {
            const measured = Date.parse(reading.measuredAt);
            expect(measured).toBeGreaterThanOrEqual(arrived);
            expect(measured).toBeLessThanOrEqual(departed);
          }
          if (row.kind === 'routine') arrivals.push(arrived);
        }
        // Routine visits come at the service interval; a cancelled one leaves twice the gap.
        for (const [index, at] of arrivals.slice(1).entries()) {
          const gapDays = (at - arrivals[index]!) / dayMs;
          expect([tank.key, gapDays >= tank.serviceIntervalDays - 1]).toEqual([tank.key, true]);
          expect([tank.key, gapDays <= 2 * tank.serviceIntervalDays + 1]).toEqual([tank.key, true]);
        }
        const latestArrival = Math.max(
          ...rows.map((row) => Date.parse(visitReportContent.parse(row.published).arrivedAt!)),
        );
        const [tankRow] = await database.db
          .select()
          .from(tanks)
          .where(eq(tanks.id, demoId(tank.key)));
        expect(tankRow!.lastVisitAt!.getTime()).toBe(latestArrival);
        // And the service reads every one of them back.
        const listed = await tankVisits(deps(), technician, demoId(tank.key));
        expect(listed.visits.filter((visit) => visit.status === 'published')).toHaveLength(rows.length);
      }
      // Some reports carry the readings the seed stored at visits, without storing them twice.
      const withReadings = await database.db.execute<{ n: number }>(
        sql`select count(*)::int as n from visits where jsonb_array_length(published->'readings') > 0`,
      );
      expect(withReadings.rows[0]!.n).toBeGreaterThan(0);
    });

    it('tells the waiting-room rescape over two visits, the second ticking off what the first carried', async () => {
      const admin = await actor('u-mara');
      const first = await getVisit(database.db, admin, demoVisitId('quayside-reef', 'rescape'));
      const second = await getVisit(database.db, admin, demoVisitId('quayside-reef', 'rescape-corals'));
      const [item] = await database.db.select().from(visitItems).where(eq(visitItems.fromVisitId, first.id));

      expect(first.kind).toBe('aquascaping');
      expect(first.published!.tasksDone).toContain('aquascape');
      expect(first.published!.notes).toMatch(/epoxy/);
      expect(first.published!.nextItems).toEqual(['Finish placing the corals on the new rockwork']);
      expect(item).toMatchObject({
        text: 'Finish placing the corals on the new rockwork',
        closedInVisitId: second.id,
      });
      expect(second.published!.closedItemIds).toEqual([item!.id]);
      expect(second.carriedItems.map((carried) => [carried.id, carried.closedInVisitId])).toContainEqual([
        item!.id,
        second.id,
      ]);
      const gapDays =
        (Date.parse(second.published!.arrivedAt!) - Date.parse(first.published!.arrivedAt!)) / dayMs;
      expect(gapDays).toBeGreaterThan(0);
      expect(gapDays).toBeLessThan(7);
      expect(second.published!.notes).toMatch(/light/);
      expect(second.published!.notes).toMatch(/flow/);
      expect(second.published!.notes).toMatch(/sting/);
      // Handling corals: a water change after.
      expect(second.published!.tasksDone).toEqual(
        expect.arrayContaining(['aquascape', 'livestock', 'water-change']),
      );
      // The corals are where the report put them.
      for (const change of second.published!.livestockChanges) {
        expect(change.action).toBe('move');
        if (change.action !== 'move') continue;
        const [animal] = await database.db
          .select()
          .from(livestock)
          .where(eq(livestock.id, change.livestockId));
        expect(animal!.placement).toBe(change.placement);
      }
      const moved = second.published!.livestockChanges.map((change) =>
        change.action === 'add' ? change.speciesId : change.livestockId,
      );
      expect(moved.sort()).toEqual(
        [demoLivestockId('quayside-reef', 'torch'), demoLivestockId('quayside-reef', 'frogspawn')].sort(),
      );
    });

    it("records the anemone taken out at the owner's request, with a water change after handling the corals", async () => {
      const anemoneId = demoLivestockId('ashdown-reef', 'anemone');
      const [row] = await database.db
        .select()
        .from(visits)
        .where(eq(visits.id, demoVisitId('ashdown-reef', 'anemone')));
      const report = visitReportContent.parse(row!.published);
      const [animal] = await database.db.select().from(livestock).where(eq(livestock.id, anemoneId));
      const history = await database.db
        .select()
        .from(livestockStatusEvents)
        .where(eq(livestockStatusEvents.livestockId, anemoneId))
        .orderBy(desc(livestockStatusEvents.changedAt));

      expect(report.livestockChanges).toEqual([
        { action: 'remove', livestockId: anemoneId, note: expect.stringMatching(/Helen's request/) },
      ]);
      expect(report.tasksDone).toEqual(expect.arrayContaining(['livestock', 'water-change']));
      expect(report.notes).toMatch(/slime/);
      expect(report.waterChange!.percent).toBeGreaterThan(10);
      expect(animal!.status).toBe('removed');
      // Written as publishing writes it: at the arrival, by the technician, after it was put on watch.
      expect(history[0]).toMatchObject({
        status: 'removed',
        changedBy: row!.publishedBy,
        changedAt: new Date(report.arrivedAt!),
      });
      expect(history[1]!.status).toBe('watch');
    });

    it("gives each technician visits today and later this week, in working hours in the tank's zone", async () => {
      const today = wallTimeOf(new Date(), london).day;
      for (const subject of ['u-tomas', 'u-priya']) {
        const technician = await actor(subject);
        const week = await listSchedule(deps(), technician, {
          from: today,
          to: addDays(today, 6),
          technicianId: 'me',
        });
        const days = week.map((visit) => wallTimeOf(new Date(visit.windowStart), visit.timeZone).day);

        expect([subject, days.filter((day) => day === today).length > 0]).toEqual([subject, true]);
        expect([subject, days.filter((day) => day > today).length > 0]).toEqual([subject, true]);
        for (const visit of week) {
          expect(visit.status).toBe('scheduled');
          expect(visit.timeZone).toBe(london);
          const start = wallTimeOf(new Date(visit.windowStart), visit.timeZone).time;
          const end = wallTimeOf(new Date(visit.windowEnd), visit.timeZone).time;
          expect([visit.tankName, start >= '07:00' && end <= '19:00' && end > start]).toEqual([
            visit.tankName,
            true,
          ]);
        }
      }
    });

    it('plans the restaurant lagoon as a repeating Monday service', async () => {
      const today = wallTimeOf(new Date(), london).day;
      const [series] = await database.db
        .select()
        .from(visitSeries)
        .where(eq(visitSeries.id, demoVisitSeriesId('saltfig-lagoon')));
      const occurrences = await database.db
        .select()
        .from(visits)
        .where(eq(visits.seriesId, series!.id))
        .orderBy(asc(visits.windowStart));
      const weekday = (day: string) => new Date(`${day}T00:00:00Z`).getUTCDay();

      expect(series).toMatchObject({ rrule: routineRule(7), startTime: '09:00', endTime: '11:00' });
      expect(series!.firstDay >= today).toBe(true);
      expect(occurrences.length).toBeGreaterThanOrEqual(4);
      for (const visit of occurrences) {
        expect(weekday(visit.occurrenceDay!)).toBe(1);
        expect(visit.occurrenceDay! <= series!.writtenUntil || visit.status !== 'scheduled').toBe(true);
        expect(wallTimeOf(visit.windowStart, london)).toEqual({ day: visit.occurrenceDay, time: '09:00' });
      }
      for (const visit of await publishedOn('saltfig-lagoon')) {
        expect(weekday(wallTimeOf(visit.windowStart, london).day)).toBe(1);
      }
    });

    it("shows the kids' river tank overdue on the staff overview, and the tanks visited on time not", async () => {
      const overview = await listTanks(database.db, await actor('u-mara'), {}, new Date());
      const overdue = Object.fromEntries(
        overview
          .filter((tank) => demoTanks.some((demo) => demoId(demo.key) === tank.id))
          .map((tank) => [demoTanks.find((demo) => demoId(demo.key) === tank.id)!.key, tank.visitOverdue]),
      );

      // The lagoon is due every Monday, so on a Monday it reads overdue until that day's report is in.
      expect(overdue).toMatchObject({
        'ashdown-river': true,
        'ashdown-reef': false,
        'quayside-reef': false,
        'ferrous-planted': false,
      });
    });

    it('keeps the first text of a report corrected after publishing, and carries open items to the next visit', async () => {
      const admin = await actor('u-mara');
      const edited = await getVisit(database.db, admin, demoVisitId('ferrous-planted', 'routine-17'));
      expect(edited.editedAt).not.toBeNull();
      expect(Date.parse(edited.editedAt!)).toBeGreaterThan(Date.parse(edited.publishedAt!));
      expect(edited.earlierVersions).toHaveLength(1);
      const earlier = await getVisitVersion(
        database.db,
        admin,
        edited.id,
        edited.earlierVersions[0]!.version,
      );
      expect(earlier.notes).not.toEqual(edited.published!.notes);
      expect(earlier.dosingRefills).toEqual([]);
      expect(edited.published!.dosingRefills.length).toBeGreaterThan(0);
      // Readings and livestock changes cannot change after publishing.
      expect(earlier.readings).toEqual(edited.published!.readings);

      const withOpenItems: string[] = [];
      for (const tank of demoTanks) {
        const listed = await tankVisits(deps(), admin, demoId(tank.key));
        if (listed.openItems.length === 0) continue;
        withOpenItems.push(tank.key);
        // Each open item waits for a visit already planned.
        expect([tank.key, listed.next?.status]).toEqual([tank.key, 'scheduled']);
        const next = await getVisit(database.db, admin, listed.next!.id);
        expect(next.carriedItems.map((item) => item.id)).toEqual(listed.openItems.map((item) => item.id));
      }
      expect(withOpenItems.length).toBeGreaterThanOrEqual(3);
    });
    it('moves the story on when seeded again on a later day, keeping a visit someone started', async () => {
      // `npm start` seeds on every start. Meanwhile the reads above wrote the series further ahead,
      // and a technician starts the report of today's visit in the running demo.
      const started = demoVisitId('ashdown-reef', 'hammer-check');
      await database.db
        .update(visits)
        .set({ status: 'in-progress', version: 1, draft: { notes: 'Hammer heads opening again.' } })
        .where(eq(visits.id, started));
      const [before] = await database.db.select().from(visits).where(eq(visits.id, started));
      const later = new Date(Date.now() + 8 * dayMs);

      await seedDemo(database.db, { issuer: 'http://127.0.0.1:3001', storage: s3.storage, now: later });

      expect(await counts()).toMatchObject({
        events: 54,
        visits: 57,
        reports: 43,
        series: 1,
        items: 9,
        versions: 1,
      });
      const [after] = await database.db.select().from(visits).where(eq(visits.id, started));
      expect(after).toMatchObject({ status: 'in-progress', version: 1, windowStart: before!.windowStart });
      const occurrences = await database.db
        .select()
        .from(visits)
        .where(eq(visits.seriesId, demoVisitSeriesId('saltfig-lagoon')));
      const laterDay = wallTimeOf(later, london).day;
      expect(occurrences).toHaveLength(4);
      for (const visit of occurrences) expect(visit.occurrenceDay! >= laterDay).toBe(true);
      // The removal moved with its visit, and the river tank is still overdue on the later day.
      const removal = visitReportContent.parse(
        (
          await database.db
            .select()
            .from(visits)
            .where(eq(visits.id, demoVisitId('ashdown-reef', 'anemone')))
        )[0]!.published,
      );
      const [latest] = await database.db
        .select()
        .from(livestockStatusEvents)
        .where(eq(livestockStatusEvents.livestockId, demoLivestockId('ashdown-reef', 'anemone')))
        .orderBy(desc(livestockStatusEvents.changedAt))
        .limit(1);
      expect(latest).toMatchObject({ status: 'removed', changedAt: new Date(removal.arrivedAt!) });
      const overview = await listTanks(database.db, await actor('u-mara'), {}, later);
      expect(overview.find((tank) => tank.id === demoId('ashdown-river'))!.visitOverdue).toBe(true);
    }, 120_000);
  });
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TimelineEntry, TimelinePage } from '@shared/schemas/timeline';
import { visitReportContent } from '@shared/schemas/visits';
import { formatDateTime } from '@shared/text/dates';
import {
  alertEvents,
  alerts,
  careTips,
  careTipTanks,
  livestockStatusEvents,
  photos,
  type tanks,
  urgentRequestEvents,
  urgentRequests,
  visits,
} from '../../api/db/schema/index';
import { signedIn, type ApiSession } from '../helpers/api-session';
import {
  addLivestockTo,
  createCompany,
  createPerson,
  createTank,
  type TestPerson,
} from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';

type Tank = typeof tanks.$inferSelect;
type ErrorBody = { error: { code: string; message: string } };

const hourMs = 3_600_000;
/** Every moment here counts back from one start, so the order the test expects is fixed. */
const start = Date.now() - 30 * 24 * hourMs;
const at = (hours: number) => new Date(start + hours * hourMs);

describe('GET /api/tanks/:tankId/timeline', () => {
  let stack: TestStack;
  let companyId: string;
  let technician: TestPerson;
  let owner: ApiSession;
  let otherOwner: ApiSession;
  let staff: ApiSession;
  let otherStaff: ApiSession;
  let reef: Tank;
  let neighbour: Tank;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    companyId = (await createCompany(db, { timeZone: 'Europe/London' })).id;
    const otherCompanyId = (await createCompany(db)).id;
    technician = await createPerson(db, { companyId, role: 'technician', issuer, name: 'Tess Tech' });
    const ownerPerson = await createPerson(db, { companyId, role: 'owner', issuer, name: 'Olive Owner' });
    const otherOwnerPerson = await createPerson(db, { companyId, role: 'owner', issuer });
    staff = await signedIn(stack, technician);
    owner = await signedIn(stack, ownerPerson);
    otherOwner = await signedIn(stack, otherOwnerPerson);
    otherStaff = await signedIn(
      stack,
      await createPerson(db, { companyId: otherCompanyId, role: 'admin', issuer }),
    );
    reef = await createTank(db, {
      companyId,
      name: 'Lobby reef',
      timeZone: 'Australia/Perth',
      owners: [ownerPerson],
    });
    neighbour = await createTank(db, { companyId, name: 'Next door', owners: [otherOwnerPerson] });
  });
  afterAll(() => stack.close());

  const timeline = (who: ApiSession, tank: { id: string }, query = '') =>
    who.get<TimelinePage & ErrorBody>(`/api/tanks/${tank.id}/timeline${query ? `?${query}` : ''}`);

  /** Every entry of a tank, page by page, through the cursors the API gives. */
  async function walk(who: ApiSession, tank: { id: string }, query: string, between?: () => Promise<void>) {
    const entries: TimelineEntry[] = [];
    let next: string | null = null;
    let pages = 0;
    do {
      const cursor: string = next ? `&before=${encodeURIComponent(next)}` : '';
      const page = await timeline(who, tank, `${query}${cursor}`);
      expect(page.status, JSON.stringify(page.body)).toBe(200);
      entries.push(...page.body.entries);
      next = page.body.next;
      pages += 1;
      if (between) await between();
    } while (next && pages < 50);
    return { entries, pages };
  }

  const publishedVisit = async (
    tank: Tank,
    publishedAt: Date,
    fields: Partial<typeof visits.$inferInsert> = {},
  ) => {
    const report = visitReportContent.parse({
      arrivedAt: new Date(publishedAt.getTime() - hourMs).toISOString(),
      tasksDone: ['glass'],
      notes: 'Cleaned the glass.',
    });
    const [row] = await stack.database.db
      .insert(visits)
      .values({
        companyId,
        tankId: tank.id,
        technicianId: technician.id,
        kind: 'routine',
        status: 'published',
        windowStart: new Date(publishedAt.getTime() - 2 * hourMs),
        windowEnd: new Date(publishedAt.getTime() - hourMs),
        draft: report,
        version: 1,
        published: report,
        publishedVersion: 1,
        publishedAt,
        publishedBy: technician.id,
        ...fields,
      })
      .returning();
    return row!;
  };

  const alertWith = async (
    tank: Tank,
    events: {
      type: 'opened' | 'escalated' | 'acknowledged' | 'resolved';
      at: Date;
      value?: number;
      note?: string;
    }[],
  ) => {
    const { db } = stack.database;
    const [alert] = await db
      .insert(alerts)
      .values({
        companyId,
        tankId: tank.id,
        kind: 'limit',
        ruleKey: `limit:temperature:${crypto.randomUUID()}`,
        parameter: 'temperature',
        severity: 'critical',
        status: events.some((e) => e.type === 'resolved') ? 'resolved' : 'open',
        // As the row reads once resolved: its words are rewritten at every change.
        title: `Temperature back within limits in ${tank.name}`,
        body: 'Temperature is back within its limits.',
        value: 29.5,
        limitValue: 27,
        direction: 'high',
        openedAt: events[0]!.at,
        lastSeenAt: events.at(-1)!.at,
      })
      .returning();
    const rows = await db
      .insert(alertEvents)
      .values(
        events.map((event) => ({
          alertId: alert!.id,
          type: event.type,
          severity: event.type === 'opened' ? ('warning' as const) : ('critical' as const),
          value: event.value ?? null,
          note: event.note ?? null,
          at: event.at,
        })),
      )
      .returning();
    return rows;
  };

  const tipTo = async (tank: Tank, deliveredAt: Date, fields: Partial<typeof careTips.$inferInsert> = {}) => {
    const { db } = stack.database;
    const [tip] = await db
      .insert(careTips)
      .values({
        companyId,
        title: 'Top up with fresh water',
        body: 'Evaporation leaves the **salt** behind: top up with fresh water, never salt water.',
        category: 'maintenance',
        audience: { kind: 'all' },
        status: 'sent',
        sentAt: deliveredAt,
        ...fields,
      })
      .returning();
    await db.insert(careTipTanks).values({ tipId: tip!.id, tankId: tank.id, deliveredAt });
    return tip!;
  };

  describe('on one tank with one of everything', () => {
    let visitId: string;
    let tipId: string;

    beforeAll(async () => {
      const { db } = stack.database;
      visitId = (
        await publishedVisit(reef, at(10), {
          editedAt: at(10.5),
          note: 'Bring the spare heater (staff only).',
        })
      ).id;
      // A draft: scheduled, its report started but never published.
      await db.insert(visits).values({
        companyId,
        tankId: reef.id,
        technicianId: technician.id,
        kind: 'equipment',
        status: 'in-progress',
        windowStart: at(11),
        windowEnd: at(12),
        draft: visitReportContent.parse({ notes: 'Draft: the pump sounds rough.' }),
        version: 2,
        note: 'Draft planning note.',
      });
      const snail = await addLivestockTo(db, reef, {
        catalogueSpeciesId: 'trochus-snail',
        quantity: 3,
        status: 'stable',
        changedAt: at(1),
      });
      await db.insert(livestockStatusEvents).values({
        livestockId: snail.id,
        status: 'sick',
        note: 'One snail upside down on the sand.',
        changedAt: at(20),
      });
      await alertWith(reef, [
        { type: 'opened', at: at(30), value: 28.2 },
        { type: 'escalated', at: at(31), value: 29.6 },
        { type: 'acknowledged', at: at(32), note: 'On my way.' },
        { type: 'resolved', at: at(33), note: 'Replaced the heater.' },
      ]);
      tipId = (await tipTo(reef, at(40))).id;
      await tipTo(reef, at(41), {
        title: 'A withdrawn tip',
        status: 'withdrawn',
        withdrawnAt: at(42),
      });
      // The neighbour's tank has its own story, which the reef's owner never sees.
      await publishedVisit(neighbour, at(15));
      await tipTo(neighbour, at(16), { title: 'Only for next door' });
    });

    it('lists published reports, livestock changes, alert events and tips, newest first', async () => {
      const { status, body } = await timeline(owner, reef);

      expect(status).toBe(200);
      expect(body.entries.map((e) => [e.kind, e.title])).toEqual([
        ['tip', 'Top up with fresh water'],
        ['alert', 'Alert resolved: Temperature too high'],
        ['alert', 'Alert now critical: Temperature too high'],
        ['alert', 'Alert opened: Temperature too high'],
        ['livestock', 'Trochus snail ×3 — sick'],
        ['visit', 'Visit report: routine service'],
        ['livestock', 'Added: Trochus snail ×3'],
      ]);
      expect(body.next).toBeNull();
    });

    it('gives each entry its time, words, link and the tank’s time zone', async () => {
      const { body } = await timeline(owner, reef);
      const byKind = (kind: string) => body.entries.filter((e) => e.kind === kind);

      expect(body.entries.every((e) => e.timeZone === 'Australia/Perth')).toBe(true);
      const [visit] = byKind('visit');
      expect(visit).toMatchObject({
        id: visitId,
        at: at(10).toISOString(),
        summary: 'By Tess Tech. Cleaned the glass.',
        link: `/tanks/${reef.id}?section=visits&visit=${visitId}`,
        editedAt: at(10.5).toISOString(),
        body: null,
      });
      expect(byKind('livestock').map((e) => e.summary)).toEqual([
        'One snail upside down on the sand.',
        'Added to the tank.',
      ]);
      expect(byKind('livestock')[0]!.link).toBe(`/tanks/${reef.id}?section=livestock`);
      expect(byKind('alert').map((e) => e.summary)).toEqual([
        'Replaced the heater.',
        'Now critical, reading 29.6 °C.',
        'Warning, reading 28.2 °C.',
      ]);
      expect(byKind('alert')[0]!.link).toBe(`/tanks/${reef.id}`);
      const [tip] = byKind('tip');
      expect(tip).toMatchObject({
        id: tipId,
        at: at(40).toISOString(),
        summary:
          'Maintenance: Evaporation leaves the salt behind: top up with fresh water, never salt water.',
        link: `/tanks/${reef.id}?section=timeline&tip=${tipId}`,
        body: 'Evaporation leaves the **salt** behind: top up with fresh water, never salt water.',
      });
    });

    it('carries a tip’s photo with its entry, and no photo with any other', async () => {
      const { db } = stack.database;
      const tank = await createTank(db, { companyId, name: 'Photo reef' });
      // Only the row is needed: the timeline names the photo, it never opens it.
      const [photo] = await db
        .insert(photos)
        .values({
          companyId,
          tankId: reef.id,
          subject: 'tank',
          objectKey: 'timeline-photo',
          thumbnailKey: 'timeline-photo-thumbnail',
          contentType: 'image/webp',
          width: 4,
          height: 3,
          bytes: 12,
        })
        .returning();
      const tip = await tipTo(tank, at(50), { photoId: photo!.id });

      const withPhoto = await timeline(staff, tank);
      const { body } = await timeline(owner, reef);

      expect(withPhoto.body.entries.map((e) => [e.kind, e.id, e.photoId])).toEqual([
        ['tip', tip.id, photo!.id],
      ]);
      expect(body.entries.map((e) => e.photoId)).toEqual(body.entries.map(() => null));
    });

    it('shows staff the same story as the owner', async () => {
      const [forOwner, forStaff] = await Promise.all([timeline(owner, reef), timeline(staff, reef)]);
      expect(forStaff.status).toBe(200);
      expect(forStaff.body).toEqual(forOwner.body);
    });

    it('never shows a draft, a planning note, a withdrawn tip or another tank’s entries', async () => {
      for (const who of [owner, staff]) {
        const text = JSON.stringify((await timeline(who, reef)).body);
        expect(text).not.toContain('Draft');
        expect(text).not.toContain('staff only');
        expect(text).not.toContain('A withdrawn tip');
        expect(text).not.toContain('Only for next door');
        expect(text).not.toContain('On my way');
      }
    });

    it('uses the company’s time zone for a tank without its own', async () => {
      const { body } = await timeline(otherOwner, neighbour);
      expect(body.entries.map((e) => [e.kind, e.timeZone])).toEqual([
        ['tip', 'Europe/London'],
        ['visit', 'Europe/London'],
      ]);
    });

    it('filters by kind, as a comma list or repeated', async () => {
      const commas = await timeline(owner, reef, 'kinds=tip,livestock');
      const repeated = await timeline(owner, reef, 'kinds=tip&kinds=livestock');

      expect(commas.status).toBe(200);
      expect(commas.body.entries.map((e) => e.kind)).toEqual(['tip', 'livestock', 'livestock']);
      expect(repeated.body).toEqual(commas.body);
      const alertsOnly = await timeline(owner, reef, 'kinds=alert');
      expect(alertsOnly.body.entries.map((e) => e.kind)).toEqual(['alert', 'alert', 'alert']);
    });

    it('refuses an unknown kind, a made-up cursor and a page over 100', async () => {
      for (const query of [
        'kinds=alert,gossip',
        'before=not-a-cursor',
        `before=${btoa('yesterday|tip|x')}`,
        'limit=101',
        'limit=0',
      ]) {
        const { status, body } = await timeline(owner, reef, query);
        expect(status, query).toBe(400);
        expect(body.error.code, query).toBe('invalid_request');
      }
    });
  });

  describe('urgent visit requests', () => {
    it('shows each change of a request but its escalations, the status in words, linking to the request', async () => {
      const { db } = stack.database;
      const tank = await createTank(db, {
        companyId,
        name: 'Urgent reef',
        timeZone: 'Europe/London',
        owners: [owner.person],
      });
      const [request] = await db
        .insert(urgentRequests)
        .values({
          companyId,
          tankId: tank.id,
          requestedBy: owner.person.id,
          requestedByName: 'Olive Owner',
          category: 'leak',
          description: 'Water on the floor under the cabinet.',
          someoneOnSite: true,
          phone: '+44 20 7946 0958',
          status: 'on-the-way',
          snapshot: { readings: [], openAlerts: [] },
          createdAt: at(60),
        })
        .returning();
      const eta = at(61.5);
      const event = (fields: Omit<typeof urgentRequestEvents.$inferInsert, 'requestId'>) => ({
        requestId: request!.id,
        ...fields,
      });
      await db.insert(urgentRequestEvents).values([
        event({ type: 'requested', actorName: 'Olive Owner', at: at(60) }),
        event({ type: 'escalated', note: 'Not acknowledged after 30 minutes (target 30).', at: at(60.5) }),
        event({
          type: 'acknowledged',
          actorName: 'Tess Tech',
          note: 'Keep the pump off.',
          eta,
          at: at(60.6),
        }),
        event({ type: 'on-the-way', actorName: 'Tess Tech', eta, at: at(61) }),
      ]);
      const expected = `Expected by ${formatDateTime(eta, 'Europe/London')}.`;
      const link = `/urgent/${request!.id}`;

      const { status, body } = await timeline(owner, tank);

      expect(status).toBe(200);
      expect(body.entries.map((e) => [e.kind, e.title, e.summary, e.link])).toEqual([
        ['urgent', 'Urgent visit: On the way', expected, link],
        ['urgent', 'Urgent visit: Acknowledged', `${expected} Keep the pump off.`, link],
        [
          'urgent',
          'Urgent visit requested: Water leak or flood',
          'Asked by Olive Owner: Water on the floor under the cabinet.',
          link,
        ],
      ]);
      expect(body.entries[2]!.at).toBe(at(60).toISOString());
      expect(JSON.stringify(body)).not.toContain('Not acknowledged');
      expect((await timeline(staff, tank)).body).toEqual(body);
      expect((await timeline(owner, tank, 'kinds=urgent')).body).toEqual(body);
      expect((await timeline(owner, tank, 'kinds=visit')).body.entries).toEqual([]);
    });
  });

  describe('who may read it', () => {
    it('answers 404 to an owner of another tank and to another company’s staff', async () => {
      for (const who of [otherOwner, otherStaff]) {
        const { status, body } = await timeline(who, reef);
        expect(status).toBe(404);
        expect(body.error.code).toBe('not_found');
        expect(JSON.stringify(body)).not.toContain('Lobby reef');
      }
    });

    it('answers 404 for a tank that does not exist and 401 without a session', async () => {
      expect((await timeline(owner, { id: crypto.randomUUID() })).status).toBe(404);
      const response = await fetch(`${stack.origin}/api/tanks/${reef.id}/timeline`);
      expect(response.status).toBe(401);
    });
  });

  describe('pagination', () => {
    let tank: Tank;

    beforeAll(async () => {
      const { db } = stack.database;
      tank = await createTank(db, { companyId, name: 'Paged reef' });
      // Eleven entries, five of them at one instant in three kinds, so pages split ties.
      const tie = at(100);
      for (const hours of [90, 95, 99]) await publishedVisit(tank, at(hours));
      await publishedVisit(tank, tie);
      for (let n = 0; n < 2; n += 1) {
        await addLivestockTo(db, tank, {
          catalogueSpeciesId: 'trochus-snail',
          status: 'stable',
          changedAt: tie,
        });
      }
      await alertWith(tank, [
        { type: 'opened', at: tie },
        { type: 'escalated', at: tie },
      ]);
      await alertWith(tank, [{ type: 'opened', at: at(80) }]);
      await tipTo(tank, at(85));
      await tipTo(tank, at(101));
    });

    it('walks the whole feed in pages, each entry once, in the order of one long page', async () => {
      const whole = await timeline(staff, tank, 'limit=100');
      const paged = await walk(staff, tank, 'limit=2');

      expect(whole.body.entries).toHaveLength(11);
      expect(paged.pages).toBe(6);
      expect(paged.entries).toEqual(whole.body.entries);
      // Ties at one instant are ordered by kind, then newest id first.
      const tied = whole.body.entries.filter((e) => e.at === at(100).toISOString());
      expect(tied.map((e) => e.kind)).toEqual(['alert', 'alert', 'livestock', 'livestock', 'visit']);
      expect(tied.slice(0, 2).map((e) => e.id)).toEqual(
        tied
          .slice(0, 2)
          .map((e) => e.id)
          .sort()
          .reverse(),
      );
    });

    it('neither repeats nor skips an entry when newer ones arrive between pages', async () => {
      const before = (await timeline(staff, tank, 'limit=100')).body.entries;
      let added = 0;
      const paged = await walk(staff, tank, 'limit=3', async () => {
        // Newer than everything, and one at the instant the first pages end on.
        added += 1;
        await publishedVisit(tank, new Date(Date.now() - added * 60_000));
        await alertWith(tank, [{ type: 'opened', at: at(101) }]);
      });

      const ids = paged.entries.map((e) => e.id);
      expect(new Set(ids).size).toBe(ids.length);
      expect(ids).toEqual(before.map((e) => e.id));
      const after = (await timeline(staff, tank, 'limit=100')).body.entries;
      expect(after).toHaveLength(before.length + 2 * added);
      expect(after.slice(0, added).every((e) => e.kind === 'visit')).toBe(true);
    });

    it('keeps to the filter across pages', async () => {
      const paged = await walk(owner, reef, 'kinds=alert&limit=1');
      expect(paged.entries.map((e) => e.kind)).toEqual(['alert', 'alert', 'alert']);
      expect(paged.pages).toBe(3);
    });
  });
});

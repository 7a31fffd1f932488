import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { CalendarFeedAddress, CalendarFeedStatus } from '@shared/schemas/calendar-feed';
import type { VisitKind, VisitStatus } from '@shared/schemas/visits';
import { wallTimeOf, zonedWindow } from '@shared/visits/recurrence';
import { users, visits } from '../../api/db/schema/index';
import { createLogger } from '../../api/lib/logger';
import { signedIn, type ApiSession } from '../helpers/api-session';
import { days } from '../helpers/clock';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';

/** One content line of an iCalendar text: `NAME;PARAMS:value`, the value unescaped. */
interface Property {
  name: string;
  params: string;
  value: string;
}

/** The content lines (RFC 5545 §3.1: a CRLF followed by a space or tab continues the line before). */
function contentLines(ics: string): string[] {
  return ics
    .replace(/\r\n[ \t]/g, '')
    .split('\r\n')
    .filter((line) => line !== '');
}

function parseLine(line: string): Property {
  const match = /^([A-Za-z0-9-]+)((?:;[^:]*)?):(.*)$/.exec(line);
  if (!match) throw new Error(`not a content line: ${line}`);
  return {
    name: match[1]!,
    params: match[2]!,
    value: match[3]!.replace(/\\n/gi, '\n').replace(/\\([,;\\])/g, '$1'),
  };
}

/** Each `kind` component (VEVENT, VTIMEZONE…) as its list of properties, sub-components flattened in. */
function components(ics: string, kind: string): Property[][] {
  const found: Property[][] = [];
  let current: Property[] | null = null;
  for (const line of contentLines(ics)) {
    if (line === `BEGIN:${kind}`) current = [];
    else if (line === `END:${kind}`) {
      if (current) found.push(current);
      current = null;
    } else current?.push(parseLine(line));
  }
  return found;
}

const valueOf = (props: Property[], name: string) => props.find((p) => p.name === name)?.value;
const propertyOf = (props: Property[], name: string) => props.find((p) => p.name === name);

/** The VEVENTs of a feed, by the visit id in their UID. */
function eventsByVisit(ics: string): Map<string, Property[]> {
  return new Map(
    components(ics, 'VEVENT').map((props) => [valueOf(props, 'UID')!.replace(/@brinewatch$/, ''), props]),
  );
}

/** "20261027T090000": an instant's wall time in a zone, as a DATE-TIME with a TZID writes it. */
function localStamp(instant: Date, zone: string) {
  const { day, time } = wallTimeOf(instant, zone);
  return `${day.replaceAll('-', '')}T${time.replace(':', '')}00`;
}

describe('calendar feed', () => {
  let stack: TestStack;
  const logLines: string[] = [];
  const issuedTokens = new Set<string>();
  const people = {} as Record<
    'technician' | 'colleague' | 'admin' | 'owner' | 'neighbour' | 'leaver' | 'clockTech' | 'elsewhere',
    TestPerson
  >;
  const as = {} as Record<keyof typeof people, ApiSession>;
  const tanks = {} as Record<'lobby' | 'boardroom' | 'foreign', { id: string; companyId: string }>;
  const visitIds = {} as Record<
    'mine' | 'myCancelled' | 'colleagues' | 'foreign' | 'longAgo' | 'farAhead' | 'adminsOwn' | 'neighbours',
    string
  >;

  async function addVisit(
    tank: { id: string; companyId: string },
    options: {
      technicianId: string | null;
      window: { start: Date; end: Date };
      kind?: VisitKind;
      status?: VisitStatus;
    },
  ) {
    const [row] = await stack.database.db
      .insert(visits)
      .values({
        companyId: tank.companyId,
        tankId: tank.id,
        technicianId: options.technicianId,
        kind: options.kind ?? 'routine',
        status: options.status ?? 'scheduled',
        windowStart: options.window.start,
        windowEnd: options.window.end,
      })
      .returning();
    return row!.id;
  }

  /** 09:00–10:00 on the wall clock of `zone`, `offsetDays` from today there. */
  function morningIn(zone: string, offsetDays: number) {
    const { day } = wallTimeOf(new Date(stack.clock.now().getTime() + days(offsetDays)), zone);
    return zonedWindow(day, '09:00', '10:00', zone);
  }

  async function issue(who: keyof typeof people) {
    const res = await as[who].post<CalendarFeedAddress>('/api/me/calendar-feed');
    expect(res.status).toBe(201);
    issuedTokens.add(res.body.url.slice(res.body.url.lastIndexOf('/') + 1).replace(/\.ics$/, ''));
    return res.body.url;
  }

  /** What a calendar app gets: no cookie, no custom headers. */
  async function poll(url: string) {
    const res = await fetch(url);
    return { res, text: await res.text() };
  }

  beforeAll(async () => {
    stack = await startTestStack({
      logger: createLogger('info', { write: (line: string) => void logLines.push(line) }),
    });
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    const company = await createCompany(db, { name: 'Tidewater Test Aquatics', timeZone: 'Europe/London' });
    const otherCompany = await createCompany(db, { timeZone: 'America/New_York' });
    const person = (role: TestPerson['role'], name: string, companyId = company.id) =>
      createPerson(db, { companyId, role, issuer, name });
    people.technician = await person('technician', 'Tess Tech');
    people.colleague = await person('technician', 'Colm Colleague');
    people.admin = await person('admin', 'Ada Admin');
    people.owner = await person('owner', 'Olive Owner');
    people.neighbour = await person('owner', 'Ned Neighbour');
    people.leaver = await person('technician', 'Lee Leaver');
    people.clockTech = await person('technician', 'Cara Clock');
    people.elsewhere = await person('technician', 'Eli Elsewhere', otherCompany.id);
    tanks.lobby = await createTank(db, {
      companyId: company.id,
      name: 'Lobby reef',
      siteLabel: 'Harbour Street office, reception',
      owners: [people.owner],
    });
    tanks.boardroom = await createTank(db, {
      companyId: company.id,
      name: 'Boardroom reef',
      siteLabel: 'Branch office; boardroom',
      owners: [people.neighbour],
      timeZone: 'Australia/Sydney',
    });
    tanks.foreign = await createTank(db, { companyId: otherCompany.id, name: 'Elsewhere reef' });

    const london = 'Europe/London';
    visitIds.mine = await addVisit(tanks.lobby, {
      technicianId: people.technician.id,
      window: morningIn(london, 2),
    });
    visitIds.myCancelled = await addVisit(tanks.boardroom, {
      technicianId: people.technician.id,
      window: morningIn('Australia/Sydney', 5),
      kind: 'equipment',
      status: 'cancelled',
    });
    visitIds.colleagues = await addVisit(tanks.lobby, {
      technicianId: people.colleague.id,
      window: morningIn(london, 3),
      kind: 'aquascaping',
    });
    visitIds.foreign = await addVisit(tanks.foreign, {
      technicianId: people.elsewhere.id,
      window: morningIn('America/New_York', 2),
    });
    visitIds.longAgo = await addVisit(tanks.lobby, {
      technicianId: people.technician.id,
      window: morningIn(london, -40),
      status: 'published',
    });
    visitIds.farAhead = await addVisit(tanks.lobby, {
      technicianId: people.technician.id,
      window: morningIn(london, 200),
    });
    visitIds.adminsOwn = await addVisit(tanks.lobby, {
      technicianId: people.admin.id,
      window: morningIn(london, 4),
      kind: 'installation',
    });
    visitIds.neighbours = await addVisit(tanks.boardroom, {
      technicianId: people.colleague.id,
      window: morningIn('Australia/Sydney', 6),
    });

    for (const who of Object.keys(people) as (keyof typeof people)[]) {
      as[who] = await signedIn(stack, people[who]);
    }
  });
  afterAll(() => stack.close());
  afterEach(() => stack.clock.reset());

  describe('GET /api/me/calendar-feed', () => {
    it('says there is no feed before one is issued', async () => {
      const res = await as.colleague.get<CalendarFeedStatus>('/api/me/calendar-feed');
      expect(res.status).toBe(200);
      expect(res.body).toEqual({ active: false });
    });
  });

  describe('POST /api/me/calendar-feed', () => {
    it("gives an address that serves a valid VCALENDAR of the technician's own visits only", async () => {
      const url = await issue('technician');
      expect(url).toMatch(new RegExp(`^${stack.origin}/api/calendar/[\\w-]{43}\\.ics$`));
      expect((await as.technician.get<CalendarFeedStatus>('/api/me/calendar-feed')).body).toEqual({
        active: true,
      });

      const { res, text } = await poll(url);
      expect(res.status).toBe(200);
      expect(res.headers.get('content-type')).toBe('text/calendar; charset=utf-8');
      expect(res.headers.get('cache-control')).toBe('private, max-age=300');

      // RFC 5545 §3.1 and §3.4: CRLF after every line, none longer than 75 octets, one VCALENDAR.
      expect(text.startsWith('BEGIN:VCALENDAR\r\nVERSION:2.0\r\n')).toBe(true);
      expect(text.endsWith('END:VCALENDAR\r\n')).toBe(true);
      expect(text.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
      const physicalLines = text.split('\r\n');
      expect(physicalLines.filter((line) => Buffer.byteLength(line, 'utf8') > 75)).toEqual([]);
      const calendar = contentLines(text).map(parseLine);
      expect(valueOf(calendar, 'PRODID')).toBe('-//Brinewatch//Visits//EN');

      const events = eventsByVisit(text);
      expect([...events.keys()].sort()).toEqual([visitIds.mine, visitIds.myCancelled].sort());
      for (const props of events.values()) {
        for (const name of ['UID', 'DTSTAMP', 'DTSTART', 'DTEND', 'SUMMARY']) {
          expect(propertyOf(props, name), name).toBeDefined();
        }
      }

      const mine = events.get(visitIds.mine)!;
      expect(valueOf(mine, 'SUMMARY')).toBe('Routine service — Lobby reef');
      expect(valueOf(mine, 'LOCATION')).toBe('Harbour Street office, reception');
      expect(valueOf(mine, 'URL')).toBe(`${stack.origin}/visits/${visitIds.mine}`);
      expect(valueOf(mine, 'STATUS')).toBeUndefined();
      const start = propertyOf(mine, 'DTSTART')!;
      expect(start.params).toBe(';TZID=Europe/London');
      expect(start.value).toMatch(/^\d{8}T090000$/);
      expect(propertyOf(mine, 'DTEND')).toMatchObject({ params: ';TZID=Europe/London' });
      expect(propertyOf(mine, 'DTEND')!.value).toMatch(/^\d{8}T100000$/);

      // A tank's own zone wins over its company's; the cancelled visit stays, marked so.
      const cancelled = events.get(visitIds.myCancelled)!;
      expect(valueOf(cancelled, 'STATUS')).toBe('CANCELLED');
      expect(valueOf(cancelled, 'SUMMARY')).toBe('Equipment work — Boardroom reef');
      expect(valueOf(cancelled, 'LOCATION')).toBe('Branch office; boardroom');
      expect(propertyOf(cancelled, 'DTSTART')).toMatchObject({ params: ';TZID=Australia/Sydney' });
      expect(propertyOf(cancelled, 'DTSTART')!.value).toMatch(/^\d{8}T090000$/);

      // Every TZID in use is described by a VTIMEZONE (RFC 5545 §3.2.19).
      const zones = components(text, 'VTIMEZONE').map((props) => valueOf(props, 'TZID'));
      expect(zones.sort()).toEqual(['Australia/Sydney', 'Europe/London']);
    });

    it('gives an admin the visits given to them, not the whole company’s', async () => {
      const { res, text } = await poll(await issue('admin'));
      expect(res.status).toBe(200);
      const events = eventsByVisit(text);
      expect([...events.keys()]).toEqual([visitIds.adminsOwn]);
      expect(valueOf(events.get(visitIds.adminsOwn)!, 'SUMMARY')).toBe('Installation — Lobby reef');
    });

    it("gives an owner the visits to their tanks, whoever makes them, linking to the tank's visits", async () => {
      const { res, text } = await poll(await issue('owner'));
      expect(res.status).toBe(200);
      const events = eventsByVisit(text);
      // The lobby's visits in the window: the technician's and the colleague's and the admin's.
      expect([...events.keys()].sort()).toEqual(
        [visitIds.mine, visitIds.colleagues, visitIds.adminsOwn].sort(),
      );
      for (const props of events.values()) {
        expect(valueOf(props, 'URL')).toBe(`${stack.origin}/tanks/${tanks.lobby.id}?section=visits`);
      }
      expect(valueOf(events.get(visitIds.colleagues)!, 'SUMMARY')).toBe('Aquascaping — Lobby reef');
    });

    it('resets the address: the old one stops working at once', async () => {
      const first = await issue('colleague');
      expect((await poll(first)).res.status).toBe(200);
      const second = await issue('colleague');
      expect(second).not.toBe(first);

      const old = await poll(first);
      expect(old.res.status).toBe(404);
      expect(JSON.parse(old.text)).toMatchObject({ error: { code: 'not_found' } });
      const current = await poll(second);
      expect(current.res.status).toBe(200);
      expect([...eventsByVisit(current.text).keys()].sort()).toEqual(
        [visitIds.colleagues, visitIds.neighbours].sort(),
      );
    });
  });

  describe('DELETE /api/me/calendar-feed', () => {
    it('stops the feed: its address answers 404 and the status says so', async () => {
      const url = await issue('neighbour');
      expect((await poll(url)).res.status).toBe(200);

      const res = await as.neighbour.delete('/api/me/calendar-feed');
      expect(res.status).toBe(204);

      expect((await poll(url)).res.status).toBe(404);
      expect((await as.neighbour.get<CalendarFeedStatus>('/api/me/calendar-feed')).body).toEqual({
        active: false,
      });
    });
  });

  describe('GET /api/calendar/:token.ics', () => {
    it('answers an unknown or malformed token with a 404 JSON error', async () => {
      for (const token of [randomBytes(32).toString('base64url'), 'not-a-token', 'x'.repeat(500)]) {
        const { res, text } = await poll(`${stack.origin}/api/calendar/${token}.ics`);
        expect(res.status, token).toBe(404);
        expect(res.headers.get('content-type')).toMatch(/^application\/json/);
        expect(JSON.parse(text)).toEqual({ error: { code: 'not_found', message: 'No such calendar feed.' } });
      }
    });

    it('stops answering once the person is deactivated', async () => {
      const url = await issue('leaver');
      expect((await poll(url)).res.status).toBe(200);
      await stack.database.db
        .update(users)
        .set({ status: 'deactivated', deactivatedAt: new Date() })
        .where(eq(users.id, people.leaver.id));
      expect((await poll(url)).res.status).toBe(404);
    });

    it('keeps visits at their wall time across a clock change, with the zone’s rules beside them', async () => {
      const url = await issue('clockTech');
      // A feed read on 10 October 2026 spans London's return to GMT on 25 October (Directive 2000/84/EC).
      stack.clock.set(new Date('2026-10-10T12:00:00Z'));
      const before = zonedWindow('2026-10-20', '09:00', '10:00', 'Europe/London');
      const after = zonedWindow('2026-10-27', '09:00', '10:00', 'Europe/London');
      expect([before.start.toISOString(), after.start.toISOString()]).toEqual([
        '2026-10-20T08:00:00.000Z',
        '2026-10-27T09:00:00.000Z',
      ]);
      const beforeId = await addVisit(tanks.lobby, { technicianId: people.clockTech.id, window: before });
      const afterId = await addVisit(tanks.lobby, { technicianId: people.clockTech.id, window: after });

      const { text } = await poll(url);
      const events = eventsByVisit(text);
      expect(propertyOf(events.get(beforeId)!, 'DTSTART')).toEqual({
        name: 'DTSTART',
        params: ';TZID=Europe/London',
        value: '20261020T090000',
      });
      expect(propertyOf(events.get(afterId)!, 'DTSTART')).toEqual({
        name: 'DTSTART',
        params: ';TZID=Europe/London',
        value: '20261027T090000',
      });

      const [london] = components(text, 'VTIMEZONE');
      const observances = london!.filter((p) => ['DTSTART', 'TZOFFSETFROM', 'TZOFFSETTO'].includes(p.name));
      const clocksBack = observances.findIndex((p) => p.name === 'DTSTART' && p.value === '20261025T020000');
      expect(clocksBack, 'an observance starting at 02:00 BST on 25 October').toBeGreaterThan(0);
      expect(observances.slice(clocksBack + 1, clocksBack + 3).map((p) => p.value)).toEqual([
        '+0100',
        '+0000',
      ]);
      // Summer time again on 28 March 2027 at 01:00 GMT.
      expect(observances.some((p) => p.name === 'DTSTART' && p.value === '20270328T010000')).toBe(true);
    });

    it('writes the instants it was given: a wall time read back through the zone is the stored one', async () => {
      const { text } = await poll(await issue('technician'));
      const [row] = await stack.database.db.select().from(visits).where(eq(visits.id, visitIds.mine));
      const start = propertyOf(eventsByVisit(text).get(visitIds.mine)!, 'DTSTART')!;
      expect(start.value).toBe(localStamp(row!.windowStart, 'Europe/London'));
    });

    it('keeps the secret address out of the log', () => {
      expect(issuedTokens.size).toBeGreaterThan(5);
      const log = logLines.join('');
      expect(log).toContain('/api/calendar/[token]');
      const leaked = [...issuedTokens].filter((token) => log.includes(token));
      expect(leaked).toEqual([]);
    });

    it('limits how often one address may read feeds', async () => {
      // Unknown tokens cost no look-up, so this spends only the budget.
      const unknown = `${stack.origin}/api/calendar/${randomBytes(32).toString('base64url')}.ics`;
      let answer: Response | null = null;
      for (let i = 0; i <= 120; i += 1) {
        answer = await fetch(unknown);
        await answer.arrayBuffer();
        if (answer.status === 429) break;
      }
      expect(answer!.status).toBe(429);
      expect(Number(answer!.headers.get('retry-after'))).toBeGreaterThan(0);
    });
  });
});

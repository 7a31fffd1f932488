import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TankChoice, TankDetail, TankSummary } from '@shared/schemas/tanks';
import { tankMembers, tanks, visits } from '../../api/db/schema/index';
import { issuePaths, signedIn, type ApiSession } from '../helpers/api-session';
import { days } from '../helpers/clock';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';

describe('tanks API', () => {
  let stack: TestStack;
  let companyId: string;
  let otherCompanyId: string;
  const people = {} as Record<
    'owner' | 'coOwner' | 'technician' | 'admin' | 'otherAdmin' | 'otherOwner',
    TestPerson
  >;
  const as = {} as Record<keyof typeof people, ApiSession>;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    const company = await createCompany(db, { timeZone: 'Europe/London' });
    const other = await createCompany(db);
    companyId = company.id;
    otherCompanyId = other.id;
    people.owner = await createPerson(db, { companyId, role: 'owner', issuer, name: 'Ada Reef' });
    people.coOwner = await createPerson(db, { companyId, role: 'owner', issuer, name: 'Ben Lagoon' });
    people.technician = await createPerson(db, { companyId, role: 'technician', issuer, name: 'Cleo Tech' });
    people.admin = await createPerson(db, { companyId, role: 'admin', issuer });
    people.otherAdmin = await createPerson(db, { companyId: other.id, role: 'admin', issuer });
    people.otherOwner = await createPerson(db, { companyId: other.id, role: 'owner', issuer });
    for (const who of Object.keys(people) as (keyof typeof people)[])
      as[who] = await signedIn(stack, people[who]);
  });
  afterAll(() => stack.close());

  const validTank = () => ({
    name: 'Hallway reef',
    siteLabel: 'Reef family home — hallway',
    style: 'mixed-reef',
    displayVolume: { value: 300, unit: 'litres' },
    sumpVolume: { value: 80, unit: 'litres' },
    serviceIntervalDays: 14,
  });

  describe('POST /api/tanks', () => {
    it('creates a tank with volumes entered in US gallons, stored in litres', async () => {
      const res = await as.technician.post<TankDetail>('/api/tanks', {
        ...validTank(),
        displayVolume: { value: 50, unit: 'us-gallons' },
        sumpVolume: { value: 10, unit: 'imperial-gallons' },
        dimensions: { lengthCm: 120, widthCm: 50, heightCm: 55 },
        setUpOn: '2025-04-12',
        assignedTechnicianId: people.technician.id,
        ownerIds: [people.owner.id, people.coOwner.id],
        notes: 'Cabinet door sticks; lift it slightly.',
        timeZone: 'Europe/Madrid',
      });

      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({
        name: 'Hallway reef',
        waterType: 'marine',
        style: 'mixed-reef',
        dimensions: { lengthCm: 120, widthCm: 50, heightCm: 55 },
        setUpOn: '2025-04-12',
        assignedTechnician: { id: people.technician.id, name: 'Cleo Tech' },
        owners: [
          { id: people.owner.id, name: 'Ada Reef' },
          { id: people.coOwner.id, name: 'Ben Lagoon' },
        ],
        timeZone: 'Europe/Madrid',
        effectiveTimeZone: 'Europe/Madrid',
        coverPhoto: null,
        status: 'no-data',
      });
      expect(res.body.displayVolumeL).toBeCloseTo(189.271, 3);
      expect(res.body.sumpVolumeL).toBeCloseTo(45.4609, 4);
    });

    it('takes the water type from the style and the time zone from the company', async () => {
      const res = await as.admin.post<TankDetail>('/api/tanks', {
        ...validTank(),
        name: 'Playroom stream',
        style: 'community-freshwater',
        sumpVolume: undefined,
      });

      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({
        waterType: 'fresh',
        sumpVolumeL: 0,
        timeZone: null,
        effectiveTimeZone: 'Europe/London',
        owners: [],
        assignedTechnician: null,
      });
    });

    it('names every field that needs attention', async () => {
      const res = await as.technician.post('/api/tanks', {
        name: ' ',
        style: 'coral-garden',
        displayVolume: { value: -5, unit: 'litres' },
        serviceIntervalDays: 0,
        timeZone: 'Mars/Olympus',
        setUpOn: '12/04/2025',
      });

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual([
        'body.displayVolume.value',
        'body.name',
        'body.serviceIntervalDays',
        'body.setUpOn',
        'body.style',
        'body.timeZone',
      ]);
    });

    it('refuses a water type the style is not for', async () => {
      const res = await as.technician.post('/api/tanks', { ...validTank(), waterType: 'fresh' });

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.style']);
    });

    it('refuses owners and technicians from another company, and saves nothing', async () => {
      const before = await stack.database.db.select().from(tanks);
      const res = await as.technician.post('/api/tanks', {
        ...validTank(),
        name: 'Sneaky',
        ownerIds: [people.otherOwner.id],
        assignedTechnicianId: people.otherAdmin.id,
      });

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.assignedTechnicianId', 'body.ownerIds']);
      expect(await stack.database.db.select().from(tanks)).toHaveLength(before.length);
    });

    it('refuses a staff member as an owner', async () => {
      const res = await as.technician.post('/api/tanks', {
        ...validTank(),
        ownerIds: [people.technician.id],
      });

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.ownerIds']);
    });

    it('is for staff only', async () => {
      expect((await as.owner.post('/api/tanks', validTank())).status).toBe(403);
    });
  });

  describe('GET /api/tanks', () => {
    let ownerTank: { id: string };
    let otherTank: { id: string };

    beforeAll(async () => {
      const { db } = stack.database;
      ownerTank = await createTank(db, {
        companyId,
        name: 'Alpha lounge reef',
        siteLabel: 'North Street flat',
        owners: [people.owner],
        assignedTechnicianId: people.technician.id,
      });
      await createTank(db, { companyId, name: 'Beta office tank', owners: [people.coOwner] });
      otherTank = await createTank(db, { companyId: otherCompanyId, name: 'Elsewhere reef' });
    });

    const names = (list: TankSummary[]) => list.map((tank) => tank.name);

    it("shows an owner only the tanks they belong to, with each tank's status", async () => {
      const res = await as.owner.get<TankSummary[]>('/api/tanks');

      expect(res.status).toBe(200);
      expect(names(res.body)).toEqual(['Alpha lounge reef', 'Hallway reef']);
      expect(res.body[0]).toMatchObject({
        id: ownerTank.id,
        siteLabel: 'North Street flat',
        owners: [{ id: people.owner.id, name: 'Ada Reef' }],
        assignedTechnician: { id: people.technician.id, name: 'Cleo Tech' },
        status: 'no-data',
        coverPhoto: null,
      });
    });

    it("shows staff every tank of their company and none of another's", async () => {
      const ours = names((await as.technician.get<TankSummary[]>('/api/tanks')).body);
      const theirs = names((await as.otherAdmin.get<TankSummary[]>('/api/tanks')).body);

      expect(ours).toEqual(['Alpha lounge reef', 'Beta office tank', 'Hallway reef', 'Playroom stream']);
      expect(theirs).toEqual(['Elsewhere reef']);
    });

    it("searches by tank name, site and owner's name", async () => {
      const search = async (q: string) =>
        names((await as.technician.get<TankSummary[]>(`/api/tanks?q=${encodeURIComponent(q)}`)).body);

      expect(await search('lounge')).toEqual(['Alpha lounge reef']);
      expect(await search('north street')).toEqual(['Alpha lounge reef']);
      expect(await search('lagoon')).toEqual(['Beta office tank', 'Hallway reef']);
      expect(await search('100%')).toEqual([]);
    });

    it('filters by assigned technician, or by nobody assigned', async () => {
      const assigned = await as.admin.get<TankSummary[]>(`/api/tanks?technicianId=${people.technician.id}`);
      const nobody = await as.admin.get<TankSummary[]>('/api/tanks?technicianId=none');
      const bad = await as.admin.get('/api/tanks?technicianId=somebody');

      expect(names(assigned.body)).toEqual(['Alpha lounge reef', 'Hallway reef']);
      expect(names(nobody.body)).toEqual(['Beta office tank', 'Playroom stream']);
      expect(bad.status).toBe(400);
    });

    it("answers another company's tank with the same 404 as a missing one", async () => {
      const foreign = await as.admin.get(`/api/tanks/${otherTank.id}`);
      const missing = await as.admin.get('/api/tanks/00000000-0000-4000-8000-000000000000');

      expect(foreign.status).toBe(404);
      expect(foreign.body).toEqual(missing.body);
    });

    it("answers an owner asking for someone else's tank with 404", async () => {
      expect((await as.coOwner.get(`/api/tanks/${ownerTank.id}`)).status).toBe(404);
      expect((await as.owner.get(`/api/tanks/${ownerTank.id}`)).status).toBe(200);
    });

    it("flags a tank overdue for service when its last visit is older than its interval, by the server's clock", async () => {
      const { db } = stack.database;
      // A company of its own, so the lists above keep their tanks.
      const company = await createCompany(db);
      const admin = await createPerson(db, {
        companyId: company.id,
        role: 'admin',
        issuer: stack.idp.issuer,
      });
      const now = stack.clock.now().getTime();
      const visitedLongAgo = new Date(now - days(15));
      const visitedRecently = new Date(now - days(3));
      await createTank(db, {
        companyId: company.id,
        name: 'Visited long ago',
        serviceIntervalDays: 14,
        lastVisitAt: visitedLongAgo,
      });
      await createTank(db, {
        companyId: company.id,
        name: 'Visited recently',
        serviceIntervalDays: 14,
        lastVisitAt: visitedRecently,
      });
      await createTank(db, { companyId: company.id, name: 'Never visited', serviceIntervalDays: 14 });
      const overdue = (list: TankSummary[]) =>
        list.map((tank) => [tank.name, tank.lastVisitAt, tank.visitOverdue]);

      try {
        const session = await signedIn(stack, admin);
        const today = await session.get<TankSummary[]>('/api/tanks');
        // Twelve days earlier, the long-ago visit was three days old and the recent one not yet made.
        stack.clock.advance(-days(12));
        const earlier = await session.get<TankSummary[]>('/api/tanks');

        expect(today.status).toBe(200);
        expect(overdue(today.body)).toEqual([
          ['Never visited', null, false],
          ['Visited long ago', visitedLongAgo.toISOString(), true],
          ['Visited recently', visitedRecently.toISOString(), false],
        ]);
        expect(earlier.status).toBe(200);
        expect(overdue(earlier.body)).toEqual([
          ['Never visited', null, false],
          ['Visited long ago', visitedLongAgo.toISOString(), false],
          ['Visited recently', visitedRecently.toISOString(), false],
        ]);
      } finally {
        stack.clock.reset();
      }
    });
    it('names each tank its next planned visit, skipping cancelled and finished ones', async () => {
      const { db } = stack.database;
      const company = await createCompany(db, { timeZone: 'Europe/London' });
      const admin = await createPerson(db, {
        companyId: company.id,
        role: 'admin',
        issuer: stack.idp.issuer,
      });
      const planned = await createTank(db, { companyId: company.id, name: 'Planned' });
      const unplanned = await createTank(db, { companyId: company.id, name: 'Unplanned' });
      const now = stack.clock.now().getTime();
      const at = (fromNowDays: number, hours = 1) => ({
        windowStart: new Date(now + days(fromNowDays)),
        windowEnd: new Date(now + days(fromNowDays) + hours * 3_600_000),
      });
      await db.insert(visits).values([
        { companyId: company.id, tankId: planned.id, kind: 'routine', ...at(2), status: 'cancelled' },
        { companyId: company.id, tankId: planned.id, kind: 'routine', ...at(5) },
        { companyId: company.id, tankId: planned.id, kind: 'aquascaping', ...at(9) },
        { companyId: company.id, tankId: planned.id, kind: 'routine', ...at(-3), status: 'published' },
        { companyId: company.id, tankId: unplanned.id, kind: 'routine', ...at(-1), status: 'published' },
      ]);

      const session = await signedIn(stack, admin);
      const list = await session.get<TankSummary[]>('/api/tanks');
      const detail = await session.get<TankDetail>(`/api/tanks/${planned.id}`);

      const expected = {
        windowStart: at(5).windowStart.toISOString(),
        windowEnd: at(5).windowEnd.toISOString(),
        timeZone: 'Europe/London',
      };
      expect(list.body.map((tank) => [tank.name, tank.nextVisit])).toEqual([
        ['Planned', expected],
        ['Unplanned', null],
      ]);
      expect(detail.body.nextVisit).toEqual(expected);
    });
  });

  describe('PATCH /api/tanks/:tankId', () => {
    it('changes only the fields sent, converting an imperial-gallon volume', async () => {
      const tank = await createTank(stack.database.db, {
        companyId,
        name: 'Before',
        notes: 'Keep me',
        displayVolumeL: 100,
      });

      const res = await as.technician.patch<TankDetail>(`/api/tanks/${tank.id}`, {
        name: 'After',
        displayVolume: { value: 44, unit: 'imperial-gallons' },
        style: 'planted-freshwater',
        ownerIds: [people.coOwner.id],
        dimensions: null,
      });

      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({
        name: 'After',
        notes: 'Keep me',
        style: 'planted-freshwater',
        waterType: 'fresh',
        owners: [{ id: people.coOwner.id, name: 'Ben Lagoon' }],
        dimensions: null,
      });
      expect(res.body.displayVolumeL).toBeCloseTo(200.028, 3);
    });

    it('replaces the owners, and an empty list leaves none', async () => {
      const tank = await createTank(stack.database.db, { companyId, owners: [people.owner, people.coOwner] });

      const res = await as.admin.patch<TankDetail>(`/api/tanks/${tank.id}`, { ownerIds: [] });

      expect(res.body.owners).toEqual([]);
      expect(
        await stack.database.db.select().from(tankMembers).where(eq(tankMembers.tankId, tank.id)),
      ).toEqual([]);
    });

    it("refuses a water type that does not suit the tank's style", async () => {
      const tank = await createTank(stack.database.db, { companyId, style: 'sps-reef' });

      const res = await as.admin.patch(`/api/tanks/${tank.id}`, { waterType: 'fresh' });

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.waterType']);
    });

    it("refuses another tank's photo as the cover", async () => {
      const tank = await createTank(stack.database.db, { companyId });

      const res = await as.admin.patch(`/api/tanks/${tank.id}`, {
        coverPhotoId: '00000000-0000-4000-8000-000000000000',
      });

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.coverPhotoId']);
    });

    it("answers 404 for another company's tank and leaves it as it was", async () => {
      const { db } = stack.database;
      const foreign = await createTank(db, { companyId: otherCompanyId, name: 'Not yours' });

      const res = await as.admin.patch(`/api/tanks/${foreign.id}`, { name: 'Mine now' });

      expect(res.status).toBe(404);
      const [after] = await db.select().from(tanks).where(eq(tanks.id, foreign.id));
      expect(after).toEqual(foreign);
    });

    it('is for staff only: an owner may not edit their own tank', async () => {
      const tank = await createTank(stack.database.db, { companyId, owners: [people.owner], name: 'Owned' });

      expect((await as.owner.patch(`/api/tanks/${tank.id}`, { name: 'Renamed' })).status).toBe(403);
    });
  });

  describe('GET /api/tanks/choices', () => {
    // Companies of their own, so the tanks the other blocks add never show up here.
    const choosers = {} as Record<'technician' | 'owner' | 'otherAdmin', ApiSession>;
    const tankIds = {} as Record<'lounge' | 'twinA' | 'twinB' | 'office' | 'elsewhere', string>;

    beforeAll(async () => {
      const { db } = stack.database;
      const issuer = stack.idp.issuer;
      const ours = await createCompany(db);
      const theirs = await createCompany(db);
      const technician = await createPerson(db, { companyId: ours.id, role: 'technician', issuer });
      const owner = await createPerson(db, { companyId: ours.id, role: 'owner', issuer, name: 'Zara Coral' });
      const coOwner = await createPerson(db, {
        companyId: ours.id,
        role: 'owner',
        issuer,
        name: 'Abel Kelp',
      });
      const otherAdmin = await createPerson(db, { companyId: theirs.id, role: 'admin', issuer });
      const otherOwner = await createPerson(db, {
        companyId: theirs.id,
        role: 'owner',
        issuer,
        name: 'Ida Far',
      });
      const twins = [
        await createTank(db, { companyId: ours.id, name: 'Twin nano', serviceIntervalDays: 7 }),
        await createTank(db, { companyId: ours.id, name: 'Twin nano', serviceIntervalDays: 7 }),
      ].sort((a, b) => a.id.localeCompare(b.id));
      tankIds.twinA = twins[0]!.id;
      tankIds.twinB = twins[1]!.id;
      tankIds.lounge = (
        await createTank(db, {
          companyId: ours.id,
          name: 'Lounge reef',
          siteLabel: 'Harbour Road house',
          serviceIntervalDays: 14,
          owners: [owner, coOwner],
        })
      ).id;
      tankIds.office = (
        await createTank(db, { companyId: ours.id, name: 'Office planted', serviceIntervalDays: 21 })
      ).id;
      tankIds.elsewhere = (
        await createTank(db, { companyId: theirs.id, name: 'Elsewhere lagoon', owners: [otherOwner] })
      ).id;
      choosers.technician = await signedIn(stack, technician);
      choosers.owner = await signedIn(stack, owner);
      choosers.otherAdmin = await signedIn(stack, otherAdmin);
    });

    it("gives staff every tank of their company by name, with its owners' names and nothing heavier", async () => {
      const res = await choosers.technician.get<TankChoice[]>('/api/tanks/choices');

      expect(res.status).toBe(200);
      expect(res.body).toEqual([
        {
          id: tankIds.lounge,
          name: 'Lounge reef',
          siteLabel: 'Harbour Road house',
          serviceIntervalDays: 14,
          ownerNames: ['Abel Kelp', 'Zara Coral'],
        },
        {
          id: tankIds.office,
          name: 'Office planted',
          siteLabel: null,
          serviceIntervalDays: 21,
          ownerNames: [],
        },
        { id: tankIds.twinA, name: 'Twin nano', siteLabel: null, serviceIntervalDays: 7, ownerNames: [] },
        { id: tankIds.twinB, name: 'Twin nano', siteLabel: null, serviceIntervalDays: 7, ownerNames: [] },
      ]);
    });

    it('gives an owner only the tanks they belong to', async () => {
      const res = await choosers.owner.get<TankChoice[]>('/api/tanks/choices');

      expect(res.status).toBe(200);
      expect(res.body.map((tank) => tank.id)).toEqual([tankIds.lounge]);
    });

    it("gives another company's staff none of ours", async () => {
      const res = await choosers.otherAdmin.get<TankChoice[]>('/api/tanks/choices');

      expect(res.status).toBe(200);
      expect(res.body).toEqual([
        {
          id: tankIds.elsewhere,
          name: 'Elsewhere lagoon',
          siteLabel: null,
          serviceIntervalDays: expect.any(Number),
          ownerNames: ['Ida Far'],
        },
      ]);
    });
  });

  describe('GET /api/tanks/technicians', () => {
    it('lists the active staff a tank can be assigned to', async () => {
      const res = await as.technician.get<{ id: string; role: string }[]>('/api/tanks/technicians');

      expect(res.status).toBe(200);
      expect(res.body.map((person) => person.id).sort()).toEqual(
        [people.admin.id, people.technician.id].sort(),
      );
      expect((await as.owner.get('/api/tanks/technicians')).status).toBe(403);
    });
  });
});

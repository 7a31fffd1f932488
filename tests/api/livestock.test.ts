import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CompatibilityCheck, LivestockItem, SpeciesEntry } from '@shared/schemas/livestock';
import type { CompatibilityWarning } from '@shared/livestock/compatibility';
import { livestock, livestockStatusEvents } from '../../api/db/schema/index';
import { issuePaths, signedIn, type ApiSession } from '../helpers/api-session';
import {
  addLivestockTo,
  createCompany,
  createPerson,
  createTank,
  type TestPerson,
} from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';

type Tank = { id: string; companyId: string };

describe('/api/tanks/:tankId/livestock', () => {
  let stack: TestStack;
  let technicianPerson: TestPerson;
  let technician: ApiSession;
  let owner: ApiSession;
  let strangerOwner: ApiSession;
  let otherAdmin: ApiSession;
  let companyId: string;
  let otherCompanyId: string;
  let reef: Tank;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    companyId = (await createCompany(db)).id;
    otherCompanyId = (await createCompany(db)).id;
    const ownerPerson = await createPerson(db, { companyId, role: 'owner', issuer });
    technicianPerson = await createPerson(db, { companyId, role: 'technician', issuer, name: 'Tess Tech' });
    technician = await signedIn(stack, technicianPerson);
    owner = await signedIn(stack, ownerPerson);
    strangerOwner = await signedIn(stack, await createPerson(db, { companyId, role: 'owner', issuer }));
    otherAdmin = await signedIn(
      stack,
      await createPerson(db, { companyId: otherCompanyId, role: 'admin', issuer }),
    );
    reef = await createTank(db, {
      companyId,
      style: 'mixed-reef',
      waterType: 'marine',
      owners: [ownerPerson],
    });
    await addLivestockTo(db, reef, { catalogueSpeciesId: 'hammer-coral', placement: 'left rock' });
    await addLivestockTo(db, reef, { catalogueSpeciesId: 'zoanthids' });
    await addLivestockTo(db, reef, { catalogueSpeciesId: 'green-chromis', quantity: 5 });
  });
  afterAll(() => stack.close());

  const path = (tank: { id: string }, id?: string) => `/api/tanks/${tank.id}/livestock${id ? `/${id}` : ''}`;
  const kinds = (warnings: CompatibilityWarning[]) => warnings.map((w) => w.kind);
  const newReef = () =>
    createTank(stack.database.db, { companyId, style: 'mixed-reef', waterType: 'marine' });

  describe('compatibility', () => {
    it('finds nothing to warn about for a peaceful addition, and adds it', async () => {
      const check = await technician.post<CompatibilityCheck>(`${path(reef)}?dryRun=true`, {
        speciesId: 'trochus-snail',
      });
      const added = await technician.post<LivestockItem>(path(reef), {
        speciesId: 'trochus-snail',
        quantity: 3,
      });

      expect(check.status).toBe(200);
      expect(check.body).toMatchObject({
        species: { id: 'trochus-snail', source: 'catalogue' },
        warnings: [],
      });
      expect(added.status).toBe(201);
      expect(added.body).toMatchObject({
        species: { id: 'trochus-snail', commonName: 'Trochus snail' },
        quantity: 3,
        status: 'stable',
        history: [{ status: 'stable', note: 'Added to the tank.', changedBy: { name: 'Tess Tech' } }],
      });
    });

    it('warns that a bubble-tip anemone stings and wanders onto the corals, without saving anything', async () => {
      const before = await stack.database.db.select().from(livestock).where(eq(livestock.tankId, reef.id));

      const res = await technician.post<CompatibilityCheck>(`${path(reef)}?dryRun=true`, {
        speciesId: 'bubble-tip-anemone',
      });

      expect(res.status).toBe(200);
      expect(kinds(res.body.warnings)).toEqual(['stings-neighbours', 'stings-neighbours', 'wanders']);
      expect(res.body.warnings[0]).toMatchObject({
        severity: 'serious',
        speciesIds: ['bubble-tip-anemone', 'hammer-coral'],
      });
      expect(res.body.warnings[2]!.message).toContain('switch pumps off at the wall');
      expect(
        await stack.database.db.select().from(livestock).where(eq(livestock.tankId, reef.id)),
      ).toHaveLength(before.length);
    });

    it('refuses to add with unacknowledged warnings (409 with the warnings), and adds once they are', async () => {
      const refused = await technician.post<{ error: { code: string; warnings: CompatibilityWarning[] } }>(
        path(reef),
        { speciesId: 'bubble-tip-anemone' },
      );
      const rowsAfterRefusal = await stack.database.db
        .select()
        .from(livestock)
        .where(eq(livestock.tankId, reef.id));
      const acknowledged = await technician.post<LivestockItem>(path(reef), {
        speciesId: 'bubble-tip-anemone',
        acknowledgeWarnings: true,
        placement: 'right rock, away from the hammer',
      });

      expect(refused.status).toBe(409);
      expect(refused.body.error.code).toBe('unacknowledged_warnings');
      expect(kinds(refused.body.error.warnings)).toEqual([
        'stings-neighbours',
        'stings-neighbours',
        'wanders',
      ]);
      expect(rowsAfterRefusal.map((row) => row.catalogueSpeciesId)).not.toContain('bubble-tip-anemone');
      expect(acknowledged.status).toBe(201);
      expect(acknowledged.body.history[0]!.note).toBe('Added with compatibility warnings acknowledged.');
    });

    it('warns about water type, fish eaten, invertebrates eaten and rivals', async () => {
      const tank = await newReef();
      const { db } = stack.database;
      await addLivestockTo(db, tank, { catalogueSpeciesId: 'green-chromis', quantity: 5 });
      await addLivestockTo(db, tank, { catalogueSpeciesId: 'kole-tang' });
      await addLivestockTo(db, tank, { catalogueSpeciesId: 'six-line-wrasse' });
      const check = async (speciesId: string) =>
        kinds(
          (await technician.post<CompatibilityCheck>(`${path(tank)}?dryRun=true`, { speciesId })).body
            .warnings,
        );

      expect(await check('neon-tetra')).toEqual(['water-type']);
      expect(await check('volitans-lionfish')).toContain('eats-fish');
      expect(await check('skunk-cleaner-shrimp')).toEqual(['eats-invertebrates']);
      expect(await check('yellow-tang')).toEqual(['territorial']);
    });

    it('leaves removed and dead livestock out of the check', async () => {
      const tank = await newReef();
      await addLivestockTo(stack.database.db, tank, {
        catalogueSpeciesId: 'six-line-wrasse',
        status: 'removed',
      });
      await addLivestockTo(stack.database.db, tank, {
        catalogueSpeciesId: 'volitans-lionfish',
        status: 'died',
      });

      const res = await technician.post<CompatibilityCheck>(`${path(tank)}?dryRun=true`, {
        speciesId: 'skunk-cleaner-shrimp',
      });

      expect(res.body.warnings).toEqual([]);
    });

    it("checks the company's own species like catalogue ones", async () => {
      const created = await technician.post<SpeciesEntry>('/api/species', {
        commonName: 'reef lobster',
        scientificName: 'Enoplometopus occidentalis',
        profile: {
          waterTypes: ['marine'],
          group: 'other-invertebrate',
          ranges: {},
          behaviour: { eatsInvertebrates: ['shrimp', 'snail'], reefSafe: 'with-caution' },
          careNotes: 'Hides by day and hunts small invertebrates at night.',
        },
      });

      const res = await technician.post<CompatibilityCheck>(`${path(reef)}?dryRun=true`, {
        speciesId: created.body.id,
      });

      expect(res.status).toBe(200);
      expect(res.body.species.source).toBe('company');
      expect(kinds(res.body.warnings)).toEqual(['eats-invertebrates']);
      expect(res.body.warnings[0]!.speciesIds).toEqual([created.body.id, 'trochus-snail']);
    });
  });

  describe('adding', () => {
    it('names the fields that need attention', async () => {
      const res = await technician.post(path(reef), { speciesId: 'Not An Id', quantity: 0, status: 'died' });

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.quantity', 'body.speciesId', 'body.status']);
    });

    it("refuses a species that is not in the catalogue or the company's own", async () => {
      const unknown = await technician.post(path(reef), { speciesId: 'sea-dragon' });
      const foreign = await technician.post(path(reef), {
        speciesId: 'company-00000000-0000-4000-8000-000000000000',
      });

      expect(unknown.status).toBe(400);
      expect(issuePaths(unknown.body)).toEqual(['body.speciesId']);
      expect(foreign.status).toBe(400);
    });

    it('is for staff only', async () => {
      expect((await owner.post(path(reef), { speciesId: 'trochus-snail' })).status).toBe(403);
      expect((await owner.post(`${path(reef)}?dryRun=true`, { speciesId: 'trochus-snail' })).status).toBe(
        403,
      );
    });
  });

  describe('reading', () => {
    it('shows the owner what lives in their tank, present animals first, with care data', async () => {
      const tank = await createTank(stack.database.db, { companyId, owners: [owner.person] });
      await addLivestockTo(stack.database.db, tank, { catalogueSpeciesId: 'yellow-tang', status: 'died' });
      await addLivestockTo(stack.database.db, tank, { catalogueSpeciesId: 'zoanthids', status: 'thriving' });

      const res = await owner.get<LivestockItem[]>(path(tank));

      expect(res.status).toBe(200);
      expect(res.body.map((item) => [item.species.id, item.status])).toEqual([
        ['zoanthids', 'thriving'],
        ['yellow-tang', 'died'],
      ]);
      expect(res.body[0]!.species.profile.behaviour.toxic?.caution).toContain('gloves');
    });

    it("hides another owner's livestock and another company's, as 404", async () => {
      const [item] = (await technician.get<LivestockItem[]>(path(reef))).body;

      expect((await strangerOwner.get(path(reef))).status).toBe(404);
      expect((await strangerOwner.get(path(reef, item!.id))).status).toBe(404);
      expect((await otherAdmin.get(path(reef))).status).toBe(404);
      expect((await otherAdmin.get(path(reef, item!.id))).status).toBe(404);
    });
  });

  describe('PATCH /api/tanks/:tankId/livestock/:livestockId', () => {
    it('records a status change with its note, who made it and when', async () => {
      const row = await addLivestockTo(stack.database.db, reef, { catalogueSpeciesId: 'torch-coral' });
      const before = stack.clock.now().getTime();

      const res = await technician.patch<LivestockItem>(path(reef, row.id), {
        status: 'watch',
        statusNote: 'Tentacles retracted since the heater fault.',
        placement: 'lower left',
      });

      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ status: 'watch', placement: 'lower left' });
      expect(res.body.history).toHaveLength(2);
      expect(res.body.history[0]).toMatchObject({
        status: 'watch',
        note: 'Tentacles retracted since the heater fault.',
        changedBy: { id: technicianPerson.id, name: 'Tess Tech' },
      });
      const changedAt = new Date(res.body.history[0]!.changedAt).getTime();
      expect(changedAt).toBeGreaterThanOrEqual(before);
      expect(changedAt).toBeLessThanOrEqual(stack.clock.now().getTime());
    });

    it('keeps the newest status when an older change is written up later', async () => {
      const row = await addLivestockTo(stack.database.db, reef, { catalogueSpeciesId: 'duncan-coral' });
      await technician.patch(path(reef, row.id), { status: 'thriving' });

      const res = await technician.patch<LivestockItem>(path(reef, row.id), {
        status: 'sick',
        statusNote: 'Seen at last month’s visit',
        statusChangedAt: new Date(stack.clock.now().getTime() - 30 * 86_400_000).toISOString(),
      });

      expect(res.body.status).toBe('thriving');
      expect(res.body.history.map((event) => event.status)).toEqual(['thriving', 'stable', 'sick']);
    });

    it('refuses a change dated in the future and a note without a status', async () => {
      const row = await addLivestockTo(stack.database.db, reef, { catalogueSpeciesId: 'galaxy-coral' });

      const future = await technician.patch(path(reef, row.id), {
        status: 'sick',
        statusChangedAt: new Date(stack.clock.now().getTime() + 86_400_000).toISOString(),
      });
      const noteOnly = await technician.patch(path(reef, row.id), { statusNote: 'Looks fine' });

      expect(future.status).toBe(400);
      expect(issuePaths(future.body)).toEqual(['body.statusChangedAt']);
      expect(noteOnly.status).toBe(400);
      expect(issuePaths(noteOnly.body)).toEqual(['body.status']);
    });

    it("answers 404 for another company's livestock and leaves it and its history unchanged", async () => {
      const { db } = stack.database;
      const foreignTank = await createTank(db, { companyId: otherCompanyId });
      const row = await addLivestockTo(db, foreignTank, { catalogueSpeciesId: 'green-chromis' });

      const patched = await technician.patch(path(foreignTank, row.id), { status: 'died' });
      const throughOurTank = await technician.patch(path(reef, row.id), { status: 'died' });
      const deleted = await technician.delete(path(foreignTank, row.id));

      expect([patched.status, throughOurTank.status, deleted.status]).toEqual([404, 404, 404]);
      const [after] = await db.select().from(livestock).where(eq(livestock.id, row.id));
      expect(after).toEqual(row);
      expect(
        await db.select().from(livestockStatusEvents).where(eq(livestockStatusEvents.livestockId, row.id)),
      ).toHaveLength(1);
    });

    it('is for staff only', async () => {
      const [item] = (await owner.get<LivestockItem[]>(path(reef))).body;
      expect((await owner.patch(path(reef, item!.id), { status: 'died' })).status).toBe(403);
      expect((await owner.delete(path(reef, item!.id))).status).toBe(403);
    });
  });

  describe('DELETE /api/tanks/:tankId/livestock/:livestockId', () => {
    it('removes an entry made by mistake, with its history', async () => {
      const row = await addLivestockTo(stack.database.db, reef, { catalogueSpeciesId: 'pulsing-xenia' });

      const res = await technician.delete(path(reef, row.id));

      expect(res.status).toBe(204);
      expect((await technician.get(path(reef, row.id))).status).toBe(404);
      expect(
        await stack.database.db
          .select()
          .from(livestockStatusEvents)
          .where(eq(livestockStatusEvents.livestockId, row.id)),
      ).toEqual([]);
    });
  });

  describe('GET /api/tanks/:tankId/comfort-range', () => {
    it('gives the water every present inhabitant tolerates, naming who sets each end', async () => {
      const tank = await createTank(stack.database.db, { companyId, owners: [owner.person] });
      await addLivestockTo(stack.database.db, tank, { catalogueSpeciesId: 'hammer-coral' });
      await addLivestockTo(stack.database.db, tank, { catalogueSpeciesId: 'bubble-tip-anemone' });
      await addLivestockTo(stack.database.db, tank, { catalogueSpeciesId: 'neon-tetra', status: 'removed' });

      const res = await owner.get<{
        ranges: Record<string, { min: number; max: number; limitedBy: { low: string[]; high: string[] } }>;
        conflicts: unknown[];
        species: { id: string }[];
      }>(`/api/tanks/${tank.id}/comfort-range`);

      expect(res.status).toBe(200);
      expect(res.body.species.map((entry) => entry.id).sort()).toEqual([
        'bubble-tip-anemone',
        'hammer-coral',
      ]);
      expect(res.body.ranges.temperature).toEqual({
        min: 24,
        max: 27,
        limitedBy: { low: ['hammer-coral', 'bubble-tip-anemone'], high: ['bubble-tip-anemone'] },
      });
      expect(res.body.ranges.gh).toBeUndefined();
      expect(res.body.conflicts).toEqual([]);
      expect((await strangerOwner.get(`/api/tanks/${tank.id}/comfort-range`)).status).toBe(404);
    });
  });
});

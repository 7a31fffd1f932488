import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EquipmentItem } from '@shared/schemas/equipment';
import { equipment } from '../../api/db/schema/index';
import { issuePaths, signedIn, type ApiSession } from '../helpers/api-session';
import { addEquipmentTo, createCompany, createPerson, createTank } from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';

describe('/api/tanks/:tankId/equipment', () => {
  let stack: TestStack;
  let owner: ApiSession;
  let strangerOwner: ApiSession;
  let technician: ApiSession;
  let otherAdmin: ApiSession;
  let tank: { id: string; companyId: string };
  let secondTank: { id: string; companyId: string };
  let foreignTank: { id: string; companyId: string };

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    const company = await createCompany(db);
    const other = await createCompany(db);
    const ownerPerson = await createPerson(db, { companyId: company.id, role: 'owner', issuer });
    tank = await createTank(db, { companyId: company.id, owners: [ownerPerson] });
    secondTank = await createTank(db, { companyId: company.id });
    foreignTank = await createTank(db, { companyId: other.id });
    owner = await signedIn(stack, ownerPerson);
    strangerOwner = await signedIn(
      stack,
      await createPerson(db, { companyId: company.id, role: 'owner', issuer }),
    );
    technician = await signedIn(
      stack,
      await createPerson(db, { companyId: company.id, role: 'technician', issuer }),
    );
    otherAdmin = await signedIn(
      stack,
      await createPerson(db, { companyId: other.id, role: 'admin', issuer }),
    );
  });
  afterAll(() => stack.close());

  const path = (t: { id: string }, id?: string) => `/api/tanks/${t.id}/equipment${id ? `/${id}` : ''}`;

  it('records equipment with its power board and outlet, and works out when maintenance is due', async () => {
    const res = await technician.post<EquipmentItem>(path(tank), {
      kind: 'return-pump',
      description: 'Return pump in the sump',
      installedOn: '2025-01-10',
      maintenanceIntervalDays: 90,
      lastServicedOn: '2025-11-20',
      powerBoard: 'B',
      outlet: '4',
    });

    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      tankId: tank.id,
      kind: 'return-pump',
      powerBoard: 'B',
      outlet: '4',
      maintenanceDueOn: '2026-02-18',
      notes: null,
    });
  });

  it('lists board by board and outlet by outlet, as the labels read, for the owner too', async () => {
    await addEquipmentTo(stack.database.db, tank, { description: 'Heater', powerBoard: 'B', outlet: '10' });
    await addEquipmentTo(stack.database.db, tank, {
      description: 'Light',
      kind: 'lighting',
      powerBoard: 'A',
      outlet: '2',
    });
    await addEquipmentTo(stack.database.db, tank, { description: 'Test kit', kind: 'other' });

    const res = await owner.get<EquipmentItem[]>(path(tank));

    expect(res.status).toBe(200);
    expect(res.body.map((item) => [item.powerBoard, item.outlet, item.description])).toEqual([
      ['A', '2', 'Light'],
      ['B', '4', 'Return pump in the sump'],
      ['B', '10', 'Heater'],
      [null, null, 'Test kit'],
    ]);
  });

  it('names the fields that need attention', async () => {
    const res = await technician.post(path(tank), {
      kind: 'flux-capacitor',
      description: '',
      installedOn: '2025-06-01',
      maintenanceIntervalDays: 0,
    });
    const crossField = await technician.post(path(tank), {
      kind: 'heater',
      description: 'Heater',
      installedOn: '2025-06-01',
      lastServicedOn: '2025-05-01',
      outlet: '3',
    });

    expect(res.status).toBe(400);
    expect(issuePaths(res.body)).toEqual(['body.description', 'body.kind', 'body.maintenanceIntervalDays']);
    expect(crossField.status).toBe(400);
    expect(issuePaths(crossField.body)).toEqual(['body.lastServicedOn', 'body.powerBoard']);
  });

  it('changes what is sent, and checks the rules against the whole row', async () => {
    const item = await addEquipmentTo(stack.database.db, tank, { powerBoard: 'A', outlet: '1' });

    const moved = await technician.patch<EquipmentItem>(path(tank, item.id), {
      outlet: '6',
      lastServicedOn: '2026-01-05',
    });
    const unplugged = await technician.patch(path(tank, item.id), { powerBoard: null });

    expect(moved.status).toBe(200);
    expect(moved.body).toMatchObject({ powerBoard: 'A', outlet: '6', lastServicedOn: '2026-01-05' });
    expect(unplugged.status).toBe(400);
    expect(issuePaths(unplugged.body)).toEqual(['body.powerBoard']);
  });

  it('deletes equipment', async () => {
    const item = await addEquipmentTo(stack.database.db, tank);

    const res = await technician.delete(path(tank, item.id));

    expect(res.status).toBe(204);
    expect((await technician.get(path(tank, item.id))).status).toBe(404);
  });

  it('lets owners read but not change equipment', async () => {
    const item = await addEquipmentTo(stack.database.db, tank);

    expect((await owner.get(path(tank, item.id))).status).toBe(200);
    expect((await owner.post(path(tank), { kind: 'heater', description: 'Mine' })).status).toBe(403);
    expect((await owner.patch(path(tank, item.id), { description: 'Mine' })).status).toBe(403);
    expect((await owner.delete(path(tank, item.id))).status).toBe(403);
  });

  it("hides a tank's equipment from an owner of another tank", async () => {
    expect((await strangerOwner.get(path(tank))).status).toBe(404);
  });

  it('answers 404 for equipment asked for through the wrong tank, and leaves it', async () => {
    const item = await addEquipmentTo(stack.database.db, tank, { description: 'Stays put' });

    expect((await technician.get(path(secondTank, item.id))).status).toBe(404);
    expect((await technician.patch(path(secondTank, item.id), { description: 'Moved' })).status).toBe(404);
    expect((await technician.delete(path(secondTank, item.id))).status).toBe(404);
    const [after] = await stack.database.db.select().from(equipment).where(eq(equipment.id, item.id));
    expect(after!.description).toBe('Stays put');
  });

  it("answers 404 for another company's tank and its equipment, and changes nothing", async () => {
    const item = await addEquipmentTo(stack.database.db, foreignTank, { description: 'Theirs' });

    expect((await technician.get(path(foreignTank))).status).toBe(404);
    expect((await technician.post(path(foreignTank), { kind: 'heater', description: 'Ours?' })).status).toBe(
      404,
    );
    expect((await technician.patch(path(foreignTank, item.id), { description: 'Ours' })).status).toBe(404);
    expect((await technician.delete(path(foreignTank, item.id))).status).toBe(404);
    expect((await otherAdmin.get(path(tank))).status).toBe(404);
    const rows = await stack.database.db.select().from(equipment).where(eq(equipment.tankId, foreignTank.id));
    expect(rows.map((row) => row.description)).toEqual(['Theirs']);
  });
});

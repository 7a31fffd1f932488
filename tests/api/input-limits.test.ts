import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { notificationPreferences } from '../../api/db/schema/index';
import { startTestStack, type TestStack } from '../helpers/stack';
import { readingsWorld } from './readings-kit';

/*
 * Input PostgreSQL would refuse, and inputs without a plausible bound, are answered with a 400 that
 * names the field, never a 500 (OWASP ASVS 5.0, V2 Validation and Business Logic).
 */
describe('input PostgreSQL cannot store, and unbounded input', () => {
  let stack: TestStack;
  let world: Awaited<ReturnType<typeof readingsWorld>>;

  beforeAll(async () => {
    stack = await startTestStack();
    world = await readingsWorld(stack, { signIn: ['owner', 'technician', 'admin'] });
  });
  afterAll(() => stack.close());

  const nul = 'a\u0000b';
  const issuePaths = (body: { error?: { issues?: { path: string }[] } }) =>
    (body.error?.issues ?? []).map((issue) => issue.path);

  const species = (profile: Record<string, unknown> = {}) => ({
    commonName: 'Pearl danio',
    scientificName: 'Danio margaritatus',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: { temperature: { min: 20, max: 26 } },
      adultSizeCm: 2.5,
      behaviour: {},
      careNotes: 'A shy schooling fish; keep eight or more.',
      ...profile,
    },
  });

  describe('a NUL byte in a text field', () => {
    it('is refused in a tank name with the field named', async () => {
      const res = await world.call('technician', 'POST', '/api/tanks', {
        name: nul,
        style: 'mixed-reef',
        displayVolume: { value: 300, unit: 'litres' },
      });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('invalid_request');
      expect(issuePaths(res.body)).toEqual(['body.name']);
    });

    it('is refused in a reading note inside a batch, naming its row', async () => {
      const res = await world.call('technician', 'POST', `/api/tanks/${world.tank.id}/readings`, {
        readings: [
          {
            parameter: 'temperature',
            value: 25,
            unit: '°C',
            measuredAt: new Date().toISOString(),
            note: nul,
          },
        ],
      });
      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.readings.0.note']);
    });

    it('is refused in equipment notes and in a device name', async () => {
      const equipment = await world.call('technician', 'POST', `/api/tanks/${world.tank.id}/equipment`, {
        kind: 'heater',
        description: 'Heater in the sump',
        notes: nul,
      });
      expect(equipment.status).toBe(400);
      expect(issuePaths(equipment.body)).toEqual(['body.notes']);
      const device = await world.call('technician', 'POST', `/api/tanks/${world.tank.id}/devices`, {
        name: nul,
      });
      expect(device.status).toBe(400);
      expect(issuePaths(device.body)).toEqual(['body.name']);
    });

    it('is refused in the tank search (?q=%00)', async () => {
      const res = await world.call('owner', 'GET', '/api/tanks?q=%00');
      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['query.q']);
    });
  });

  it('refuses a lone surrogate in species text stored as JSON', async () => {
    const res = await world.call(
      'technician',
      'POST',
      '/api/species',
      species({ careNotes: 'ok \ud800 then' }),
    );
    expect(res.status).toBe(400);
    expect(issuePaths(res.body)).toEqual(['body.profile.careNotes']);
  });

  it('still stores a well-formed surrogate pair (an emoji)', async () => {
    const res = await world.call('technician', 'POST', '/api/species', {
      ...species({ careNotes: 'Feeds well 🐟' }),
      commonName: 'Emoji danio',
    });
    expect(res.status).toBe(201);
  });

  it('refuses a reading-list cursor whose id does not fit a bigint', async () => {
    const res = await world.call(
      'owner',
      'GET',
      `/api/tanks/${world.tank.id}/readings/list?before=2026-01-01T00:00:00.000Z_99999999999999999999`,
    );
    expect(res.status).toBe(400);
    expect(issuePaths(res.body)).toEqual(['query.before']);
    const fits = await world.call(
      'owner',
      'GET',
      `/api/tanks/${world.tank.id}/readings/list?before=2026-01-01T00:00:00.000Z_9007199254740991`,
    );
    expect(fits.status).toBe(200);
  });

  describe('dates outside a plausible range', () => {
    it.each(['0001-01-01', '9999-12-31'])('refuses a tank set up on %s', async (day) => {
      const res = await world.call('technician', 'PATCH', `/api/tanks/${world.tank.id}`, { setUpOn: day });
      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.setUpOn']);
    });

    it.each(['0001-01-01', '9999-12-31'])('refuses equipment installed on %s', async (day) => {
      const res = await world.call('technician', 'POST', `/api/tanks/${world.tank.id}/equipment`, {
        kind: 'heater',
        description: 'Heater in the sump',
        installedOn: day,
      });
      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.installedOn']);
    });

    it('refuses livestock added in year 1', async () => {
      const res = await world.call('technician', 'POST', `/api/tanks/${world.tank.id}/livestock`, {
        speciesId: 'ocellaris-clownfish',
        addedOn: '0001-01-01',
      });
      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toContain('body.addedOn');
    });

    it.each([
      ['0001-01-01T00:00:00Z', '0001-01-01T08:00:00Z'],
      ['9999-12-31T00:00:00Z', '9999-12-31T08:00:00Z'],
    ])('refuses an on-call shift from %s', async (startsAt, endsAt) => {
      const res = await world.call('admin', 'POST', '/api/on-call', {
        userId: world.people.technician.id,
        startsAt,
        endsAt,
      });
      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(expect.arrayContaining(['body.startsAt', 'body.endsAt']));
    });

    it.each(['0001-01-01T00:00:00Z', '9999-12-31T00:00:00Z'])(
      'refuses a reading measured at %s',
      async (measuredAt) => {
        const res = await world.call('technician', 'POST', `/api/tanks/${world.tank.id}/readings`, {
          readings: [{ parameter: 'temperature', value: 25, unit: '°C', measuredAt }],
        });
        expect(res.status).toBe(400);
        expect(issuePaths(res.body)).toEqual(['body.readings.0.measuredAt']);
      },
    );

    it('accepts a date in range', async () => {
      const res = await world.call('technician', 'PATCH', `/api/tanks/${world.tank.id}`, {
        setUpOn: '2020-01-01',
      });
      expect(res.status).toBe(200);
    });
  });

  it('refuses species care notes of a megabyte', async () => {
    const res = await world.call(
      'technician',
      'POST',
      '/api/species',
      species({ careNotes: 'x'.repeat(1_000_000) }),
    );
    expect(res.status).toBe(400);
    expect(issuePaths(res.body)).toEqual(['body.profile.careNotes']);
  });

  describe('PUT /api/notifications/preferences', () => {
    const preferences = {
      push: ['warning', 'critical'],
      email: ['critical'],
      inApp: ['notice', 'warning', 'critical'],
      quietHours: null,
      timeZone: 'Europe/London',
    };

    it('refuses a time zone the runtime does not know', async () => {
      const res = await world.call('owner', 'PUT', '/api/notifications/preferences', {
        ...preferences,
        timeZone: 'Mars/Olympus_Mons',
      });
      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.timeZone']);
    });

    it('refuses 10,000 entries in a list', async () => {
      const res = await world.call('owner', 'PUT', '/api/notifications/preferences', {
        ...preferences,
        push: Array.from({ length: 10_000 }, () => 'critical'),
      });
      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.push']);
    });

    it('stores a list once, whatever repeats it was sent with', async () => {
      const res = await world.call('owner', 'PUT', '/api/notifications/preferences', {
        ...preferences,
        email: ['critical', 'critical', 'warning', 'critical'],
      });
      expect(res.status).toBe(200);
      const [row] = await stack.database.db
        .select()
        .from(notificationPreferences)
        .where(eq(notificationPreferences.userId, world.people.owner.id));
      expect((row?.preferences as { email: string[] }).email).toEqual(['critical', 'warning']);
    });
  });
});

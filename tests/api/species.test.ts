import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SpeciesEntry } from '@shared/schemas/livestock';
import type { SpeciesInput } from '@shared/schemas/species';
import { issuePaths, signedIn, type ApiSession } from '../helpers/api-session';
import { createCompany, createPerson } from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';

const pearlDanio: SpeciesInput = {
  commonName: 'celestial pearl danio',
  scientificName: 'Danio margaritatus',
  family: 'Danionidae',
  profile: {
    waterTypes: ['fresh'],
    group: 'fish',
    ranges: { temperature: { min: 20, max: 26 }, ph: { min: 6.5, max: 7.5 } },
    adultSizeCm: 2.5,
    behaviour: {},
    careNotes: 'A tiny, shy schooling fish for planted tanks; keep eight or more.',
  },
};

describe('/api/species', () => {
  let stack: TestStack;
  let technician: ApiSession;
  let owner: ApiSession;
  let otherTechnician: ApiSession;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    const company = await createCompany(db);
    const other = await createCompany(db);
    technician = await signedIn(
      stack,
      await createPerson(db, { companyId: company.id, role: 'technician', issuer }),
    );
    owner = await signedIn(stack, await createPerson(db, { companyId: company.id, role: 'owner', issuer }));
    otherTechnician = await signedIn(
      stack,
      await createPerson(db, { companyId: other.id, role: 'technician', issuer }),
    );
  });
  afterAll(() => stack.close());

  const search = async (who: ApiSession, query: string) =>
    (await who.get<SpeciesEntry[]>(`/api/species?${query}`)).body.map((entry) => entry.id);

  describe('GET /api/species', () => {
    it('searches the catalogue by common name, best match first', async () => {
      const ids = await search(technician, 'q=clown');

      expect(ids.slice(0, 4)).toEqual([
        'clown-goby',
        'clown-loach',
        'maroon-clownfish',
        'ocellaris-clownfish',
      ]);
    });

    it('searches by scientific name and filters by water type and group', async () => {
      expect(await search(technician, 'q=entacmaea')).toEqual(['bubble-tip-anemone']);
      expect(await search(technician, 'q=tetra&waterType=marine')).toEqual([]);
      expect(await search(technician, 'q=tetra&waterType=fresh')).toEqual(['cardinal-tetra', 'neon-tetra']);
      const anemones = await search(technician, 'group=anemone');
      expect(anemones.sort()).toEqual(['bubble-tip-anemone', 'carpet-anemone', 'rock-flower-anemone']);
    });

    it('gives each entry its care profile and where it comes from', async () => {
      const [entry] = (await owner.get<SpeciesEntry[]>('/api/species?q=zoanthids')).body;

      expect(entry).toMatchObject({
        id: 'zoanthids',
        source: 'catalogue',
        scientificName: 'Zoanthus spp.',
        profile: { group: 'zoanthid', behaviour: { toxic: { hazard: 'contact-toxin' } } },
      });
    });

    it('refuses a bad filter', async () => {
      const res = await technician.get('/api/species?waterType=lava');

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['query.waterType']);
    });
  });

  describe('POST /api/species', () => {
    it("adds the company's own species, which its staff find and no other company sees", async () => {
      const res = await technician.post<SpeciesEntry>('/api/species', pearlDanio);

      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({
        id: expect.stringMatching(/^company-[0-9a-f-]{36}$/),
        commonName: 'celestial pearl danio',
        family: 'Danionidae',
        source: 'company',
        profile: { behaviour: { stings: false, territorial: false, reefSafe: true } },
      });
      expect(await search(technician, 'q=pearl')).toEqual([res.body.id]);
      expect(await search(otherTechnician, 'q=pearl')).toEqual([]);
      expect((await technician.get(`/api/species/${res.body.id}`)).status).toBe(200);
      expect((await otherTechnician.get(`/api/species/${res.body.id}`)).status).toBe(404);
    });

    it('refuses the same scientific name twice, and one already in the catalogue', async () => {
      const again = await technician.post('/api/species', { ...pearlDanio, commonName: 'galaxy rasbora' });
      const catalogued = await technician.post('/api/species', {
        ...pearlDanio,
        commonName: 'clown',
        scientificName: 'Amphiprion ocellaris',
      });

      expect(again.status).toBe(409);
      expect(catalogued.status).toBe(409);
      expect(catalogued.body).toMatchObject({ error: { code: 'species_in_catalogue' } });
    });

    it('names the fields that need attention', async () => {
      const res = await technician.post('/api/species', {
        commonName: '',
        scientificName: 'danio MARGARITATUS',
        profile: {
          waterTypes: [],
          group: 'fish',
          ranges: { temperature: { min: 26, max: 20 } },
          behaviour: { stings: true },
          careNotes: 'x',
        },
      });

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual([
        'body.commonName',
        'body.profile.adultSizeCm',
        'body.profile.behaviour.stingReachCm',
        'body.profile.ranges.temperature.max',
        'body.profile.waterTypes',
        'body.scientificName',
      ]);
    });

    it('is for staff only', async () => {
      expect(
        (await owner.post('/api/species', { ...pearlDanio, scientificName: 'Danio choprae' })).status,
      ).toBe(403);
    });
  });
});

import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { speciesCatalogue, findSpecies } from '@shared/livestock/catalogue';
import { companySpeciesPrefix, type SpeciesEntry, type SpeciesQuery } from '@shared/schemas/livestock';
import type { speciesInput } from '@shared/schemas/species';
import { careProfile, type Species } from '@shared/livestock/species';
import type { z } from 'zod';
import type { Db } from '../db/client';
import { companySpecies } from '../db/schema/index';
import { conflict, notFound } from '../lib/http-error';
import type { Actor } from './actors';

type CompanySpeciesRow = typeof companySpecies.$inferSelect;

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

const catalogueEntries: readonly SpeciesEntry[] = speciesCatalogue.map((entry) => ({
  ...entry,
  source: 'catalogue' as const,
}));

export function companySpeciesId(rowId: string): string {
  return `${companySpeciesPrefix}${rowId}`;
}

/** The row id inside a company species id, or null for a catalogue id. */
export function companySpeciesRowId(speciesId: string): string | null {
  if (!speciesId.startsWith(companySpeciesPrefix)) return null;
  const rowId = speciesId.slice(companySpeciesPrefix.length);
  return uuidPattern.test(rowId) ? rowId : null;
}

function fromRow(row: CompanySpeciesRow): SpeciesEntry {
  return {
    id: companySpeciesId(row.id),
    commonName: row.commonName,
    scientificName: row.scientificName,
    ...(row.family ? { family: row.family } : {}),
    // Written through the same schema, so reading it back through it only fills defaults.
    profile: careProfile.parse(row.profile),
    source: 'company',
  };
}

/** Best match first: the name starts with the words, then a word starts with them, then anywhere. */
function rank(entry: Species, q: string): number {
  const names = [entry.commonName.toLowerCase(), entry.scientificName.toLowerCase()];
  if (names.some((name) => name.startsWith(q))) return 0;
  if (names.some((name) => name.split(/[\s-]+/).some((word) => word.startsWith(q)))) return 1;
  if (names.some((name) => name.includes(q))) return 2;
  return -1;
}

export async function searchSpecies(db: Db, actor: Actor, query: SpeciesQuery): Promise<SpeciesEntry[]> {
  const own = (
    await db
      .select()
      .from(companySpecies)
      .where(eq(companySpecies.companyId, actor.companyId))
      .orderBy(asc(companySpecies.commonName))
  ).map(fromRow);
  const q = query.q?.toLowerCase() ?? '';
  return [...own, ...catalogueEntries]
    .filter((entry) => !query.waterType || entry.profile.waterTypes.includes(query.waterType))
    .filter((entry) => !query.group || entry.profile.group === query.group)
    .map((entry) => ({ entry, rank: q ? rank(entry, q) : 0 }))
    .filter(({ rank }) => rank >= 0)
    .sort((a, b) => a.rank - b.rank || a.entry.commonName.localeCompare(b.entry.commonName, 'en'))
    .slice(0, query.limit)
    .map(({ entry }) => entry);
}

/** Species by id as this company sees them: the catalogue plus its own, never another company's. */
export async function resolveSpecies(
  db: Db,
  companyId: string,
  ids: string[],
): Promise<Map<string, SpeciesEntry>> {
  const found = new Map<string, SpeciesEntry>();
  const rowIds: string[] = [];
  for (const id of new Set(ids)) {
    const rowId = companySpeciesRowId(id);
    if (rowId) rowIds.push(rowId);
    else {
      const entry = findSpecies(id);
      if (entry) found.set(id, { ...entry, source: 'catalogue' });
    }
  }
  if (rowIds.length > 0) {
    const rows = await db
      .select()
      .from(companySpecies)
      .where(and(inArray(companySpecies.id, rowIds), eq(companySpecies.companyId, companyId)));
    for (const row of rows) found.set(companySpeciesId(row.id), fromRow(row));
  }
  return found;
}

export async function getSpecies(db: Db, actor: Actor, speciesId: string): Promise<SpeciesEntry> {
  const entry = (await resolveSpecies(db, actor.companyId, [speciesId])).get(speciesId);
  if (!entry) throw notFound('species');
  return entry;
}

export async function createCompanySpecies(
  db: Db,
  actor: Actor,
  input: z.output<typeof speciesInput>,
): Promise<SpeciesEntry> {
  const scientific = input.scientificName.toLowerCase();
  const inCatalogue = speciesCatalogue.find((entry) => entry.scientificName.toLowerCase() === scientific);
  if (inCatalogue) {
    throw conflict(
      'species_in_catalogue',
      `${input.scientificName} is already in the catalogue as the ${inCatalogue.commonName}.`,
    );
  }
  const [existing] = await db
    .select({ id: companySpecies.id })
    .from(companySpecies)
    .where(
      and(
        eq(companySpecies.companyId, actor.companyId),
        sql`lower(${companySpecies.scientificName}) = ${scientific}`,
      ),
    );
  const alreadyAdded = () =>
    conflict('species_exists', `Your company has already added ${input.scientificName}.`);
  if (existing) throw alreadyAdded();
  const [row] = await db
    .insert(companySpecies)
    .values({
      companyId: actor.companyId,
      commonName: input.commonName,
      scientificName: input.scientificName,
      family: input.family ?? null,
      profile: input.profile,
    })
    // Two staff adding the same species at once: the unique index decides, not a 500.
    .onConflictDoNothing({ target: [companySpecies.companyId, companySpecies.scientificName] })
    .returning();
  if (!row) throw alreadyAdded();
  return fromRow(row);
}

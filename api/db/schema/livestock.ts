import { sql } from 'drizzle-orm';
import {
  check,
  date,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { livestockStatuses } from '@shared/schemas/livestock-status';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { tanks } from './tanks';
import { users } from './users';

/** Species a company adds beyond the catalogue shipped with the product (which lives in shared/). */
export const companySpecies = pgTable(
  'company_species',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    commonName: text('common_name').notNull(),
    scientificName: text('scientific_name').notNull(),
    /** Scientific family when known; rivalry between related fish is judged by it. */
    family: text('family'),
    /** The same care-profile shape as the catalogue, validated by shared/livestock/species.ts. */
    profile: jsonb('profile').notNull(),
    ...timestamps,
  },
  (t) => [uniqueIndex('company_species_name_key').on(t.companyId, t.scientificName)],
);

export const livestockStatus = pgEnum('livestock_status', livestockStatuses);

export const livestock = pgTable(
  'livestock',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    /** Exactly one of these: a catalogue id, or the company's own species. */
    catalogueSpeciesId: text('catalogue_species_id'),
    companySpeciesId: uuid('company_species_id').references(() => companySpecies.id, {
      onDelete: 'restrict',
    }),
    nickname: text('nickname'),
    quantity: integer('quantity').notNull().default(1),
    addedOn: date('added_on'),
    source: text('source'),
    placement: text('placement'),
    status: livestockStatus('status').notNull().default('stable'),
    ...timestamps,
  },
  (t) => [
    index('livestock_tank_idx').on(t.tankId),
    check('livestock_one_species', sql`(${t.catalogueSpeciesId} is null) <> (${t.companySpeciesId} is null)`),
    check('livestock_quantity_positive', sql`${t.quantity} > 0`),
  ],
);

export const livestockStatusEvents = pgTable(
  'livestock_status_events',
  {
    id: id(),
    livestockId: uuid('livestock_id')
      .notNull()
      .references(() => livestock.id, { onDelete: 'cascade' }),
    status: livestockStatus('status').notNull(),
    note: text('note'),
    changedBy: uuid('changed_by').references(() => users.id, { onDelete: 'set null' }),
    changedAt: timestamp('changed_at', { withTimezone: true }).notNull(),
    ...timestamps,
  },
  (t) => [index('livestock_status_events_livestock_idx').on(t.livestockId, t.changedAt)],
);

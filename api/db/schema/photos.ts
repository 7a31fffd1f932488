import { index, integer, pgEnum, pgTable, text, uuid, type AnyPgColumn } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { livestock } from './livestock';
import { tanks } from './tanks';
import { users } from './users';

export const photoSubject = pgEnum('photo_subject', ['tank', 'livestock', 'visit', 'message']);

/**
 * A re-encoded picture in object storage. It belongs to one tank (and maybe one animal), so
 * it is served under exactly the same access rule as that tank.
 */
export const photos = pgTable(
  'photos',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references((): AnyPgColumn => tanks.id, { onDelete: 'cascade' }),
    livestockId: uuid('livestock_id').references((): AnyPgColumn => livestock.id, { onDelete: 'cascade' }),
    subject: photoSubject('subject').notNull(),
    objectKey: text('object_key').notNull(),
    thumbnailKey: text('thumbnail_key').notNull(),
    contentType: text('content_type').notNull(),
    width: integer('width').notNull(),
    height: integer('height').notNull(),
    bytes: integer('bytes').notNull(),
    caption: text('caption'),
    uploadedBy: uuid('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [index('photos_tank_idx').on(t.tankId), index('photos_livestock_idx').on(t.livestockId)],
);

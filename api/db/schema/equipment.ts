import { date, index, integer, pgEnum, pgTable, text, uuid } from 'drizzle-orm/pg-core';
import { equipmentKinds } from '@shared/schemas/equipment';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { tanks } from './tanks';

export const equipmentKind = pgEnum('equipment_kind', equipmentKinds);

export const equipment = pgTable(
  'equipment',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    kind: equipmentKind('kind').notNull(),
    description: text('description').notNull(),
    installedOn: date('installed_on'),
    maintenanceIntervalDays: integer('maintenance_interval_days'),
    lastServicedOn: date('last_serviced_on'),
    /** Where it is plugged in, e.g. board "B", outlet "4": the labelled map under the cabinet. */
    powerBoard: text('power_board'),
    outlet: text('outlet'),
    notes: text('notes'),
    ...timestamps,
  },
  (t) => [index('equipment_tank_idx').on(t.tankId)],
);

import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { projectPath } from '../lib/project-root';
import type { Db } from './client';

export const migrationsFolder = projectPath('drizzle');

export async function applyMigrations(db: Db): Promise<void> {
  await migrate(db, { migrationsFolder });
}

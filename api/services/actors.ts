import { and, eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import type { Role } from '@shared/people/permissions';
import { companies, users } from '../db/schema/index';

export type { Role };

export interface Actor {
  id: string;
  companyId: string;
  companyName: string;
  role: Role;
  name: string;
  email: string;
}

export async function findActiveActor(db: Db, userId: string): Promise<Actor | null> {
  const [row] = await db
    .select({
      id: users.id,
      companyId: users.companyId,
      companyName: companies.name,
      role: users.role,
      name: users.name,
      email: users.email,
    })
    .from(users)
    .innerJoin(companies, eq(companies.id, users.companyId))
    .where(and(eq(users.id, userId), eq(users.status, 'active')));
  return row ?? null;
}

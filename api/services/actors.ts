import type { Db } from '../db/client';
import { preparedStatement } from '../db/prepared';
import type { Role } from '@shared/people/permissions';

export type { Role };

export interface Actor {
  id: string;
  companyId: string;
  companyName: string;
  role: Role;
  name: string;
  email: string;
}

/** On every signed-in request, so prepared once per connection (db/prepared.ts). */
const activeActor = preparedStatement<Actor, [userId: string]>(
  'active-actor',
  `select u.id, u.company_id as "companyId", c.name as "companyName", u.role, u.name, u.email
   from users u join companies c on c.id = u.company_id
   where u.id = $1 and u.status = 'active'`,
);

export async function findActiveActor(db: Db, userId: string): Promise<Actor | null> {
  const [row] = await activeActor(db, userId);
  return row ?? null;
}

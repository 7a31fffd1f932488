import { and, asc, eq, inArray, ne, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { tankMembers, tanks, users } from '../db/schema/index';
import { conflict, notFound } from '../lib/http-error';
import type { ClientSummary, StaffMember } from '@shared/schemas/users';
import type { Actor } from './actors';
import { recordAudit, type AuditSource } from './audit';
import type { StaffRole } from '@shared/people/permissions';

export async function findUserByIdentity(db: Db, issuer: string, subject: string) {
  const [user] = await db
    .select()
    .from(users)
    .where(and(eq(users.issuer, issuer), eq(users.subject, subject)));
  return user ?? null;
}

const publicColumns = {
  id: users.id,
  name: users.name,
  email: users.email,
  role: users.role,
  status: users.status,
};

export function listStaff(db: Db, actor: Actor): Promise<StaffMember[]> {
  return db
    .select(publicColumns)
    .from(users)
    .where(and(eq(users.companyId, actor.companyId), ne(users.role, 'owner')))
    .orderBy(asc(users.name));
}

async function findCompanyUser(db: Db, actor: Actor, userId: string) {
  const [user] = await db
    .select()
    .from(users)
    .where(and(eq(users.id, userId), eq(users.companyId, actor.companyId)));
  if (!user) throw notFound('user');
  return user;
}

type UserRow = typeof users.$inferSelect;

const asTarget = (user: UserRow) => ({ kind: 'user' as const, id: user.id, label: user.name });

export async function changeStaffRole(
  db: Db,
  actor: Actor,
  userId: string,
  role: StaffRole,
  source: AuditSource,
) {
  const user = await findCompanyUser(db, actor, userId);
  if (user.role === 'owner') throw conflict('not_staff', 'Clients do not have a staff role.');
  if (user.id === actor.id) throw conflict('own_role', 'Ask another admin to change your own role.');
  return db.transaction(async (tx) => {
    const [updated] = await tx
      .update(users)
      .set({ role })
      .where(eq(users.id, user.id))
      .returning(publicColumns);
    await recordAudit(tx, {
      companyId: actor.companyId,
      actor,
      action: 'user.role-changed',
      target: asTarget(user),
      before: { role: user.role },
      after: { role },
      source,
    });
    return updated!;
  });
}

/** Deactivation ends every session of that person at once, in every API process. */
export async function deactivateUser(db: Db, actor: Actor, userId: string, source: AuditSource) {
  const user = await findCompanyUser(db, actor, userId);
  if (user.id === actor.id) throw conflict('own_account', 'You cannot deactivate your own account.');
  return db.transaction(async (tx) => {
    const [updated] = await tx
      .update(users)
      // A deactivated person's calendar address stops for good; after reactivation they issue a new one.
      .set({ status: 'deactivated', deactivatedAt: source.at, calendarTokenHash: null })
      .where(eq(users.id, user.id))
      .returning(publicColumns);
    await tx.execute(sql`delete from session where sess->>'userId' = ${user.id}`);
    await recordAudit(tx, {
      companyId: actor.companyId,
      actor,
      action: 'user.deactivated',
      target: asTarget(user),
      before: { status: user.status },
      after: { status: 'deactivated' },
      source,
    });
    return updated!;
  });
}

export async function reactivateUser(db: Db, actor: Actor, userId: string, source: AuditSource) {
  const user = await findCompanyUser(db, actor, userId);
  return db.transaction(async (tx) => {
    const [updated] = await tx
      .update(users)
      .set({ status: 'active', deactivatedAt: null })
      .where(eq(users.id, user.id))
      .returning(publicColumns);
    await recordAudit(tx, {
      companyId: actor.companyId,
      actor,
      action: 'user.reactivated',
      target: asTarget(user),
      before: { status: user.status },
      after: { status: 'active' },
      source,
    });
    return updated!;
  });
}

export async function listClients(db: Db, actor: Actor): Promise<ClientSummary[]> {
  const owners = await db
    .select({ id: users.id, name: users.name, email: users.email, status: users.status })
    .from(users)
    .where(and(eq(users.companyId, actor.companyId), eq(users.role, 'owner')))
    .orderBy(asc(users.name));
  if (owners.length === 0) return [];
  const memberships = await db
    .select({ userId: tankMembers.userId, id: tanks.id, name: tanks.name })
    .from(tankMembers)
    .innerJoin(tanks, eq(tanks.id, tankMembers.tankId))
    .where(
      inArray(
        tankMembers.userId,
        owners.map((owner) => owner.id),
      ),
    )
    .orderBy(asc(tanks.name));
  return owners.map((owner) => ({
    ...owner,
    tanks: memberships.filter((m) => m.userId === owner.id).map(({ id, name }) => ({ id, name })),
  }));
}

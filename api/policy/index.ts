import { and, eq, exists, type Placeholder, type SQL } from 'drizzle-orm';
import type { RequestHandler } from 'express';
import type { Db } from '../db/client';
import { tankMembers, tanks } from '../db/schema/index';
import { forbidden, notFound, unauthorized } from '../lib/http-error';
import { roleCan, type Permission } from '@shared/people/permissions';
import type { Actor } from '../services/actors';

/**
 * The one place that decides who may do what. Deny by default: every route names a
 * permission (or is listed as public), role decides the permission, and object access goes
 * through the scope helpers below, so another company's or another owner's object is a 404.
 */

export { permissions, type Permission } from '@shared/people/permissions';

/** Marks a route handler with the policy it enforces; the route audit test reads this. */
export interface PolicyMarked {
  policy?: Permission | 'public' | 'device';
}

function marked<T extends RequestHandler>(
  handler: T,
  policy: Permission | 'public' | 'device',
): T & PolicyMarked {
  return Object.assign(handler, { policy });
}

export function can(permission: Permission): RequestHandler & PolicyMarked {
  return marked((req, _res, next) => {
    if (!req.actor) return next(unauthorized());
    if (!roleCan(req.actor.role, permission)) return next(forbidden());
    next();
  }, permission);
}

/** For the few routes anyone may call (health, sign-in); the audit test keeps the list. */
export const publicRoute: RequestHandler & PolicyMarked = marked((_req, _res, next) => next(), 'public');

/**
 * For routes a device calls with its bearer token instead of a session (middleware/device-token.ts
 * proves the token); the audit test keeps the list, apart from the public one.
 */
export function devicePolicy<T extends RequestHandler>(handler: T): T & PolicyMarked {
  return marked(handler, 'device');
}

export function requireActor(actor: Actor | null | undefined): Actor {
  if (!actor) throw unauthorized();
  return actor;
}

export const isStaff = (actor: Pick<Actor, 'role'>) => actor.role !== 'owner';

/** The tanks an actor may see: their company's for staff, their memberships for owners. */
/**
 * Who the visibility rule is about: an actor, or the shape of one whose id and company are a
 * prepared statement's placeholders (the same rule, built once for a hot path).
 */
export type TankViewer = Pick<Actor, 'role'> & {
  id: string | Placeholder;
  companyId: string | Placeholder;
};

export function visibleTanks(db: Db, actor: TankViewer): SQL {
  const ownCompany = eq(tanks.companyId, actor.companyId);
  if (isStaff(actor)) return ownCompany;
  const membership = db
    .select({ one: tankMembers.userId })
    .from(tankMembers)
    .where(and(eq(tankMembers.tankId, tanks.id), eq(tankMembers.userId, actor.id)));
  return and(ownCompany, exists(membership))!;
}

export type TankAccess = 'read' | 'write';

/** Finds a tank the actor may use that way, or answers 404 exactly as for a missing one. */
export async function findTankFor(db: Db, actor: Actor, tankId: string, access: TankAccess) {
  if (access === 'write' && !isStaff(actor)) throw forbidden();
  const [tank] = await db
    .select()
    .from(tanks)
    .where(and(eq(tanks.id, tankId), visibleTanks(db, actor)));
  if (!tank) throw notFound('tank');
  return tank;
}

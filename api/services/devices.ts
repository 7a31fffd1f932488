import { and, desc, eq, isNull } from 'drizzle-orm';
import type { CreatedDevice, DeviceSummary } from '@shared/schemas/readings';
import type { Db } from '../db/client';
import { preparedStatement } from '../db/prepared';
import { devices } from '../db/schema/index';
import { notFound } from '../lib/http-error';
import { hashToken, newSecretToken } from '../lib/tokens';
import { findTankFor } from '../policy/index';
import type { Actor } from './actors';
import { tankExistsFrom } from './readings';
import { recordAudit, type AuditSource } from './audit';

/** What the ingest route knows about its caller, taken from the token alone. */
export interface DeviceIdentity {
  id: string;
  companyId: string;
  tankId: string;
  /** Readings from before this are refused (`tankExistsFrom`). */
  tankExistsFrom: Date;
}

/** Says "a Brinewatch device token" to secret scanners and to the person pasting it. */
const tokenPrefix = 'bwd_';

const deviceByToken = preparedStatement<
  { id: string; companyId: string; tankId: string; createdAt: Date; setUpOn: string | null },
  [tokenHash: string]
>(
  'device-by-token',
  `select d.id, d.company_id as "companyId", d.tank_id as "tankId",
     t.created_at as "createdAt", t.set_up_on::text as "setUpOn"
   from devices d join tanks t on t.id = d.tank_id
   where d.token_hash = $1 and d.revoked_at is null`,
);

/** A new device token with what is stored of it: its hash, and a hint staff can tell it by. */
export function issueDeviceToken(): { token: string; tokenHash: string; tokenHint: string } {
  const token = `${tokenPrefix}${newSecretToken()}`;
  return { token, tokenHash: hashToken(token), tokenHint: token.slice(0, tokenPrefix.length + 6) };
}

type DeviceRow = typeof devices.$inferSelect;

function present(row: DeviceRow): DeviceSummary {
  return {
    id: row.id,
    name: row.name,
    tokenHint: row.tokenHint,
    lastSeenAt: row.lastSeenAt?.toISOString() ?? null,
    revokedAt: row.revokedAt?.toISOString() ?? null,
    createdAt: row.createdAt.toISOString(),
  };
}

export async function listDevices(db: Db, actor: Actor, tankId: string): Promise<DeviceSummary[]> {
  const tank = await findTankFor(db, actor, tankId, 'write');
  const rows = await db
    .select()
    .from(devices)
    .where(eq(devices.tankId, tank.id))
    .orderBy(desc(devices.createdAt));
  return rows.map(present);
}

/** The token (256 random bits) leaves the server once, in this answer; only its hash is kept. */
export async function createDevice(
  db: Db,
  actor: Actor,
  tankId: string,
  name: string,
  source: AuditSource,
): Promise<CreatedDevice> {
  const tank = await findTankFor(db, actor, tankId, 'write');
  const { token, tokenHash, tokenHint } = issueDeviceToken();
  const row = await db.transaction(async (tx) => {
    const [inserted] = await tx
      .insert(devices)
      .values({ companyId: tank.companyId, tankId: tank.id, name, tokenHash, tokenHint, createdBy: actor.id })
      .returning();
    await recordAudit(tx, {
      companyId: tank.companyId,
      actor,
      action: 'device.created',
      target: { kind: 'device', id: inserted!.id, label: `${name} (${tank.name})` },
      details: { tank: tank.name, tokenHint },
      source,
    });
    return inserted!;
  });
  return { device: present(row), token };
}

/** Revoked, not deleted: its readings keep saying which device sent them. */
export async function revokeDevice(
  db: Db,
  actor: Actor,
  tankId: string,
  deviceId: string,
  source: AuditSource,
) {
  const tank = await findTankFor(db, actor, tankId, 'write');
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(devices)
      .set({ revokedAt: source.at })
      .where(and(eq(devices.id, deviceId), eq(devices.tankId, tank.id), isNull(devices.revokedAt)))
      .returning();
    if (!row) throw notFound('active device');
    await recordAudit(tx, {
      companyId: tank.companyId,
      actor,
      action: 'device.revoked',
      target: { kind: 'device', id: row.id, label: `${row.name} (${tank.name})` },
      details: { tank: tank.name, tokenHint: row.tokenHint },
      source,
    });
    return present(row);
  });
}

export async function findDeviceByToken(db: Db, token: string): Promise<DeviceIdentity | null> {
  // On every ingest request: one prepared statement brings the tank's dates along.
  const [row] = await deviceByToken(db, hashToken(token));
  if (!row) return null;
  const { createdAt, setUpOn, ...device } = row;
  return { ...device, tankExistsFrom: tankExistsFrom({ createdAt, setUpOn }) };
}

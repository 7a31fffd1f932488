import { and, desc, eq, gt, isNull } from 'drizzle-orm';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import { companies, invitations, tankMembers, tanks, users } from '../db/schema/index';
import { escapeHtml } from '../lib/html';
import { notFound } from '../lib/http-error';
import type { VerifiedIdentity } from '../lib/oidc-client';
import { hashToken, newSecretToken } from '../lib/tokens';
import { findTankFor } from '../policy/index';
import type { CreateInvitationInput, Invitation } from '@shared/schemas/invitations';
import type { Actor } from './actors';
import { recordAudit, type AuditSource } from './audit';

type InvitationRow = typeof invitations.$inferSelect;

function statusOf(row: InvitationRow, now: Date): Invitation['status'] {
  if (row.acceptedAt) return 'accepted';
  if (row.revokedAt) return 'revoked';
  return row.expiresAt <= now ? 'expired' : 'pending';
}

function present(row: InvitationRow, tank: { id: string; name: string } | null, now: Date): Invitation {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    tank,
    expiresAt: row.expiresAt.toISOString(),
    status: statusOf(row, now),
  };
}

export function invitationLink(appOrigin: string, token: string) {
  return `${appOrigin}/auth/invitation/${token}`;
}

export async function createInvitation(
  deps: AppDeps,
  actor: Actor,
  input: CreateInvitationInput,
  appOrigin: string,
  source: AuditSource,
) {
  const now = source.at;
  const tank = input.role === 'owner' ? await findTankFor(deps.db, actor, input.tankId, 'write') : null;
  const token = newSecretToken();
  const row = await deps.db.transaction(async (tx) => {
    const [inserted] = await tx
      .insert(invitations)
      .values({
        companyId: actor.companyId,
        email: input.email,
        name: input.name ?? null,
        role: input.role,
        tankId: tank?.id ?? null,
        tokenHash: hashToken(token),
        expiresAt: new Date(now.getTime() + deps.env.INVITATION_DAYS * 24 * 60 * 60 * 1000),
        invitedBy: actor.id,
      })
      .returning();
    await recordAudit(tx, {
      companyId: actor.companyId,
      actor,
      action: 'invitation.sent',
      target: { kind: 'invitation', id: inserted!.id, label: inserted!.email },
      details: { role: inserted!.role, ...(tank ? { tank: tank.name } : {}) },
      source,
    });
    return inserted;
  });
  const invitation = present(row!, tank && { id: tank.id, name: tank.name }, now);
  const emailSent = await sendInvitationMail(deps, actor, invitation, invitationLink(appOrigin, token));
  return { ...invitation, emailSent };
}

async function sendInvitationMail(deps: AppDeps, actor: Actor, invitation: Invitation, link: string) {
  const greeting = invitation.name ? `Hello ${invitation.name},` : 'Hello,';
  const what =
    invitation.role === 'owner'
      ? `follow your tank "${invitation.tank?.name}" on Brinewatch`
      : `join ${actor.companyName} on Brinewatch as ${invitation.role === 'admin' ? 'an admin' : 'a technician'}`;
  const days = deps.env.INVITATION_DAYS;
  const text = [
    greeting,
    '',
    `${actor.name} of ${actor.companyName} has invited you to ${what}.`,
    '',
    `Open this link to accept (it works once, for ${days} days):`,
    link,
    '',
    'If you did not expect this, you can ignore this e-mail.',
  ].join('\n');
  const html = `<p>${escapeHtml(greeting)}</p>
<p>${escapeHtml(actor.name)} of ${escapeHtml(actor.companyName)} has invited you to ${escapeHtml(what)}.</p>
<p><a href="${escapeHtml(link)}">Accept the invitation</a> — the link works once, for ${days} days.</p>
<p>If you did not expect this, you can ignore this e-mail.</p>`;
  try {
    await deps.mailer.send({
      to: invitation.email,
      subject: `Your Brinewatch invitation from ${actor.companyName}`,
      text,
      html,
    });
    return true;
  } catch (error) {
    deps.logger.warn({ err: error, invitationId: invitation.id }, 'invitation e-mail not sent');
    return false;
  }
}

export async function listInvitations(db: Db, actor: Actor, now: Date): Promise<Invitation[]> {
  const rows = await db
    .select({ invitation: invitations, tank: { id: tanks.id, name: tanks.name } })
    .from(invitations)
    .leftJoin(tanks, eq(tanks.id, invitations.tankId))
    .where(eq(invitations.companyId, actor.companyId))
    .orderBy(desc(invitations.createdAt));
  return rows.map((row) => present(row.invitation, row.tank, now));
}

export async function revokeInvitation(db: Db, actor: Actor, invitationId: string, source: AuditSource) {
  await db.transaction(async (tx) => {
    const [row] = await tx
      .update(invitations)
      .set({ revokedAt: source.at })
      .where(
        and(
          eq(invitations.id, invitationId),
          eq(invitations.companyId, actor.companyId),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
        ),
      )
      .returning();
    if (!row) throw notFound('open invitation');
    await recordAudit(tx, {
      companyId: actor.companyId,
      actor,
      action: 'invitation.revoked',
      target: { kind: 'invitation', id: row.id, label: row.email },
      details: { role: row.role },
      source,
    });
  });
}

/** Is this link worth sending the person to sign in for? */
export async function findOpenInvitation(db: Db, token: string, now: Date) {
  const [row] = await db
    .select({ id: invitations.id, tokenHash: invitations.tokenHash })
    .from(invitations)
    .where(
      and(
        eq(invitations.tokenHash, hashToken(token)),
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
        gt(invitations.expiresAt, now),
      ),
    );
  return row ?? null;
}

type UserRow = typeof users.$inferSelect;

/**
 * Links the signed-in identity to the invitation, once: the row is locked and checked again
 * inside the transaction, so two tabs racing with one link cannot both succeed.
 */
export async function acceptPendingInvitation(
  deps: AppDeps,
  tokenHash: string,
  identity: VerifiedIdentity,
  existing: UserRow | null,
  source: AuditSource,
): Promise<UserRow | null> {
  const now = source.at;
  return deps.db.transaction(async (tx) => {
    const [invite] = await tx
      .select()
      .from(invitations)
      .where(
        and(
          eq(invitations.tokenHash, tokenHash),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
          gt(invitations.expiresAt, now),
        ),
      )
      .for('update');
    if (!invite) return null;
    if (existing && existing.companyId !== invite.companyId) return null;
    const [company] = await tx.select().from(companies).where(eq(companies.id, invite.companyId));
    if (!company) return null;

    let user: UserRow | undefined = existing ?? undefined;
    if (!user) {
      [user] = await tx
        .insert(users)
        .values({
          companyId: invite.companyId,
          issuer: identity.issuer,
          subject: identity.subject,
          email: identity.email ?? invite.email,
          name: identity.name ?? invite.name ?? invite.email,
          role: invite.role,
        })
        .returning();
    } else if (invite.role !== 'owner' && user.role === 'owner') {
      [user] = await tx.update(users).set({ role: invite.role }).where(eq(users.id, user.id)).returning();
    }
    if (invite.tankId) {
      await tx.insert(tankMembers).values({ tankId: invite.tankId, userId: user!.id }).onConflictDoNothing();
    }
    await tx
      .update(invitations)
      .set({ acceptedAt: now, acceptedBy: user!.id })
      .where(eq(invitations.id, invite.id));
    await recordAudit(tx, {
      companyId: invite.companyId,
      actor: user!,
      action: 'invitation.accepted',
      target: { kind: 'invitation', id: invite.id, label: invite.email },
      details: { role: invite.role },
      source,
    });
    return user ?? null;
  });
}

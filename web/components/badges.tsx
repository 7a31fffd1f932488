import type { Invitation } from '@shared/schemas/invitations';
import type { Role } from '@shared/schemas/users';

const tones = {
  good: 'bg-healthy-100 text-healthy-700',
  waiting: 'bg-watch-100 text-watch-700',
  off: 'bg-nodata-100 text-nodata-700',
  plain: 'bg-ink-100 text-ink-900',
} as const;

// Each tone also has its own shape, so the badge never relies on colour alone.
const marks = {
  good: 'h-2 w-2 rounded-full bg-current',
  waiting: 'h-2 w-2 rounded-full border-2 border-current',
  off: 'h-0.5 w-2.5 bg-current',
  plain: 'hidden',
} as const;

function Badge({ tone, children }: { tone: keyof typeof tones; children: string }) {
  return (
    <span
      className={`inline-flex items-center gap-1.5 rounded-full px-2.5 py-0.5 text-sm font-bold ${tones[tone]}`}
    >
      <span aria-hidden="true" className={`shrink-0 ${marks[tone]}`} />
      {children}
    </span>
  );
}

export const roleLabels: Record<Role, string> = { owner: 'Client', technician: 'Technician', admin: 'Admin' };

export function RoleBadge({ role }: { role: Role }) {
  return <Badge tone="plain">{roleLabels[role]}</Badge>;
}

export function AccountStatusBadge({ status }: { status: 'active' | 'deactivated' }) {
  return status === 'active' ? <Badge tone="good">Active</Badge> : <Badge tone="off">Deactivated</Badge>;
}

const invitationStatus = {
  pending: { tone: 'waiting', label: 'Waiting' },
  accepted: { tone: 'good', label: 'Accepted' },
  expired: { tone: 'off', label: 'Expired' },
  revoked: { tone: 'off', label: 'Revoked' },
} as const;

export function InvitationStatusBadge({ status }: { status: Invitation['status'] }) {
  const { tone, label } = invitationStatus[status];
  return <Badge tone={tone}>{label}</Badge>;
}

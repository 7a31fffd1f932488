import { Badge } from './badge';
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

function ToneBadge({ tone, children }: { tone: keyof typeof tones; children: string }) {
  return (
    <Badge tone={tones[tone]} mark={tone === 'plain' ? undefined : <span className={marks[tone]} />}>
      {children}
    </Badge>
  );
}

export const roleLabels: Record<Role, string> = { owner: 'Client', technician: 'Technician', admin: 'Admin' };

export function RoleBadge({ role }: { role: Role }) {
  return <ToneBadge tone="plain">{roleLabels[role]}</ToneBadge>;
}

export function AccountStatusBadge({ status }: { status: 'active' | 'deactivated' }) {
  return status === 'active' ? (
    <ToneBadge tone="good">Active</ToneBadge>
  ) : (
    <ToneBadge tone="off">Deactivated</ToneBadge>
  );
}

const invitationStatus = {
  pending: { tone: 'waiting', label: 'Waiting' },
  accepted: { tone: 'good', label: 'Accepted' },
  expired: { tone: 'off', label: 'Expired' },
  revoked: { tone: 'off', label: 'Revoked' },
} as const;

export function InvitationStatusBadge({ status }: { status: Invitation['status'] }) {
  const { tone, label } = invitationStatus[status];
  return <ToneBadge tone={tone}>{label}</ToneBadge>;
}

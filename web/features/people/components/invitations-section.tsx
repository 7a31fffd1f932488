import { useState } from 'react';
import { isStaffRole } from '@shared/people/permissions';
import type { Invitation } from '@shared/schemas/invitations';
import { InvitationStatusBadge, RoleBadge } from '../../../components/badges';
import { Button } from '../../../components/button';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { problemMessage } from '../../../lib/problem-message';
import { formatDate } from '../../../lib/format';
import { useInvitations } from '../api/list-invitations';
import { useRevokeInvitation } from '../api/revoke-invitation';

function InvitationRow({
  invitation,
  onRevoked,
}: {
  invitation: Invitation;
  onRevoked: (message: string) => void;
}) {
  const [confirming, setConfirming] = useState(false);
  const revoke = useRevokeInvitation();
  const close = () => {
    setConfirming(false);
    revoke.reset();
  };
  const when =
    invitation.status === 'pending'
      ? `Link works until ${formatDate(invitation.expiresAt)}`
      : invitation.status === 'expired'
        ? `Expired ${formatDate(invitation.expiresAt)}`
        : null;
  return (
    <li className="flex flex-col gap-3 p-4 sm:flex-row sm:items-center sm:justify-between">
      <div className="min-w-0">
        <h3 className="break-all font-bold text-ink-900">{invitation.email}</h3>
        {invitation.name && <p className="text-sm text-ink-700">{invitation.name}</p>}
        <div className="mt-2 flex flex-wrap items-center gap-2">
          {isStaffRole(invitation.role) && <RoleBadge role={invitation.role} />}
          <InvitationStatusBadge status={invitation.status} />
          {invitation.tank && <span className="text-sm text-ink-700">Tank: {invitation.tank.name}</span>}
        </div>
        {when && <p className="mt-1 text-sm text-ink-700">{when}</p>}
      </div>
      {invitation.status === 'pending' && (
        <>
          <Button tone="secondary" onClick={() => setConfirming(true)}>
            Revoke<span className="sr-only"> the invitation for {invitation.email}</span>
          </Button>
          <ConfirmDialog
            open={confirming}
            title="Revoke this invitation?"
            confirmLabel="Revoke"
            pendingLabel="Revoking…"
            pending={revoke.isPending}
            error={revoke.isError ? problemMessage(revoke.error) : undefined}
            onClose={close}
            onConfirm={() =>
              revoke.mutate(invitation.id, {
                onSuccess: () => {
                  close();
                  onRevoked(`The invitation for ${invitation.email} is revoked.`);
                },
              })
            }
          >
            <p>
              The link sent to <strong className="break-all text-ink-900">{invitation.email}</strong> stops
              working at once. You can send a new invitation later.
            </p>
          </ConfirmDialog>
        </>
      )}
    </li>
  );
}

const audiences = {
  staff: {
    title: 'Invitations',
    includes: (invitation: Invitation) => isStaffRole(invitation.role),
    none: 'Nobody has been invited to the team yet.',
  },
  clients: {
    title: 'Client invitations',
    includes: (invitation: Invitation) => !isStaffRole(invitation.role),
    none: 'No client has been invited yet.',
  },
} as const;

/** Invitations for one audience: the ones still waiting first, the settled ones folded away. */
export function InvitationsSection({ audience }: { audience: keyof typeof audiences }) {
  const { title, includes, none } = audiences[audience];
  const invitations = useInvitations();
  const [announcement, setAnnouncement] = useState('');
  const titleId = `${audience}-invitations-title`;

  let body;
  if (invitations.isPending) body = <LoadingState label="Loading invitations…" />;
  else if (invitations.isError) {
    body = (
      <ErrorState
        error={invitations.error}
        what="the invitations"
        onRetry={() => void invitations.refetch()}
      />
    );
  } else {
    const mine = invitations.data.filter(includes);
    const waiting = mine.filter((invitation) => invitation.status === 'pending');
    const settled = mine.filter((invitation) => invitation.status !== 'pending');
    const row = (invitation: Invitation) => (
      <InvitationRow key={invitation.id} invitation={invitation} onRevoked={setAnnouncement} />
    );
    body =
      mine.length === 0 ? (
        <EmptyState title="No invitations">{none}</EmptyState>
      ) : (
        <>
          {waiting.length === 0 ? (
            <EmptyState title="None waiting">
              Every invitation has been accepted, has expired or was revoked.
            </EmptyState>
          ) : (
            <ul
              aria-label="Waiting to be accepted"
              className="divide-y divide-ink-100 rounded-card bg-white shadow-card"
            >
              {waiting.map(row)}
            </ul>
          )}
          {settled.length > 0 && (
            <details className="mt-4 rounded-card bg-white shadow-card">
              <summary className="flex min-h-11 cursor-pointer items-center rounded-card px-4 font-bold text-ink-900">
                Accepted, expired and revoked ({settled.length})
              </summary>
              <ul className="divide-y divide-ink-100 border-t border-ink-100">{settled.map(row)}</ul>
            </details>
          )}
        </>
      );
  }

  return (
    <section aria-labelledby={titleId}>
      <h2 id={titleId} className="text-xl font-bold text-ink-900">
        {title}
      </h2>
      <p role="status" className="text-sm font-bold text-healthy-700 not-empty:mt-2">
        {announcement}
      </p>
      <div className="mt-2">{body}</div>
    </section>
  );
}

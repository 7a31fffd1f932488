import { useState } from 'react';
import type { StaffMember } from '@shared/schemas/users';
import { AccountStatusBadge, RoleBadge } from '../../../components/badges';
import { Button } from '../../../components/button';
import { FieldError } from '../../../components/field-error';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { problemMessage } from '../../../lib/problem-message';
import { useStaff } from '../../../lib/queries/people';
import { useChangeStaffRole } from '../api/change-staff-role';
import { AccountStatusAction } from './account-status-action';

const otherRole = { technician: 'admin', admin: 'technician' } as const;

function StaffRow({
  member,
  isMe,
  onDone,
}: {
  member: StaffMember;
  isMe: boolean;
  onDone: (message: string) => void;
}) {
  const changeRole = useChangeStaffRole();
  const role = member.role === 'admin' ? 'admin' : 'technician';
  const next = otherRole[role];
  return (
    <li className="flex flex-col gap-3 p-4 sm:flex-row sm:flex-wrap sm:items-center sm:justify-between">
      <div className="min-w-0">
        <h3 className="font-bold text-ink-900">
          {member.name}
          {isMe && <span className="font-normal text-ink-700"> (you)</span>}
        </h3>
        <p className="break-all text-sm text-ink-700">{member.email}</p>
        <div className="mt-2 flex flex-wrap gap-2">
          <RoleBadge role={member.role} />
          <AccountStatusBadge status={member.status} />
        </div>
      </div>
      {isMe ? (
        <p className="text-sm text-ink-700 sm:max-w-56 sm:text-right">
          Another admin can change your role or account.
        </p>
      ) : (
        <div className="flex flex-wrap gap-2">
          <Button
            tone="secondary"
            disabled={changeRole.isPending}
            onClick={() =>
              changeRole.mutate(
                { userId: member.id, role: next },
                {
                  onSuccess: () =>
                    onDone(`${member.name} is now ${next === 'admin' ? 'an admin' : 'a technician'}.`),
                },
              )
            }
          >
            {changeRole.isPending ? 'Changing role…' : next === 'admin' ? 'Make admin' : 'Make technician'}
            <span className="sr-only"> {member.name}</span>
          </Button>
          <AccountStatusAction
            person={member}
            kept="The readings and notes they recorded stay in Brinewatch."
            onDone={onDone}
          />
        </div>
      )}
      {changeRole.isError && (
        <div role="alert" className="basis-full">
          <FieldError>{problemMessage(changeRole.error)}</FieldError>
        </div>
      )}
    </li>
  );
}

export function StaffList({ meId }: { meId: string | undefined }) {
  const staff = useStaff();
  const [announcement, setAnnouncement] = useState('');
  return (
    <section aria-labelledby="staff-title">
      <h2 id="staff-title" className="text-xl font-bold text-ink-900">
        Team
      </h2>
      <p role="status" className="text-sm font-bold text-healthy-700 not-empty:mt-2">
        {announcement}
      </p>
      <div className="mt-2">
        {staff.isPending ? (
          <LoadingState label="Loading the team…" />
        ) : staff.isError ? (
          <ErrorState error={staff.error} what="the team" onRetry={() => void staff.refetch()} />
        ) : staff.data.length === 0 ? (
          <EmptyState title="No staff yet">
            Invite your first technician with the form on this page.
          </EmptyState>
        ) : (
          <ul className="divide-y divide-ink-100 rounded-card bg-white shadow-card">
            {staff.data.map((member) => (
              <StaffRow key={member.id} member={member} isMe={member.id === meId} onDone={setAnnouncement} />
            ))}
          </ul>
        )}
      </div>
    </section>
  );
}

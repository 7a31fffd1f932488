import { Page } from '../../components/page';
import { useMe } from '../../lib/auth';
import { InvitationsSection } from '../../features/people/components/invitations-section';
import { InviteStaffForm } from '../../features/people/components/invite-staff-form';
import { StaffList } from '../../features/people/components/staff-list';

export function ConsoleStaffRoute() {
  const { data: me } = useMe();
  return (
    <Page
      title="Staff"
      description={`Who works in Brinewatch for ${me?.company.name ?? 'your company'}, and who is invited.`}
    >
      <title>Staff — Brinewatch</title>
      <div className="grid items-start gap-8 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)] lg:grid-rows-[auto_1fr]">
        <StaffList meId={me?.id} />
        <InviteStaffForm className="lg:col-start-2 lg:row-span-2 lg:row-start-1" />
        <InvitationsSection audience="staff" />
      </div>
    </Page>
  );
}

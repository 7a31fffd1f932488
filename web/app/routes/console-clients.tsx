import { Page } from '../../components/page';
import { ClientList } from '../../features/people/components/client-list';
import { InvitationsSection } from '../../features/people/components/invitations-section';
import { InviteClientForm } from '../../features/people/components/invite-client-form';
import { can, useMe } from '../../lib/auth';

export function ConsoleClientsRoute() {
  const { data: me } = useMe();
  return (
    <Page title="Clients" description="The people who own the tanks your company looks after.">
      <title>Clients — Brinewatch</title>
      {can(me, 'invitations:manage') ? (
        <div className="grid items-start gap-8 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)] lg:grid-rows-[auto_1fr]">
          <ClientList canManage={can(me, 'staff:manage')} />
          <InviteClientForm className="lg:col-start-2 lg:row-span-2 lg:row-start-1" />
          <InvitationsSection audience="clients" />
        </div>
      ) : (
        <ClientList canManage={false} />
      )}
    </Page>
  );
}

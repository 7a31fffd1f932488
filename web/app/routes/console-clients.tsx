import { Page } from '../../components/page';
import { useMe } from '../../lib/auth';
import { ClientList } from '../../features/clients/components/client-list';
import { InviteClientForm } from '../../features/clients/components/invite-client-form';
import { InvitationsSection } from '../../features/staff/components/invitations-section';

export function ConsoleClientsRoute() {
  const { data: me } = useMe();
  const isAdmin = me?.role === 'admin';
  return (
    <Page title="Clients" description="The people who own the tanks your company looks after.">
      <title>Clients — Brinewatch</title>
      {isAdmin ? (
        <div className="grid items-start gap-8 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)] lg:grid-rows-[auto_1fr]">
          <ClientList canManage />
          <InviteClientForm className="lg:col-start-2 lg:row-span-2 lg:row-start-1" />
          <InvitationsSection audience="clients" />
        </div>
      ) : (
        <ClientList canManage={false} />
      )}
    </Page>
  );
}

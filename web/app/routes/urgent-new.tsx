import { Link, useParams } from 'react-router';
import { Page } from '../../components/page';
import { ErrorState, LoadingState } from '../../components/states';
import { StatusShape } from '../../components/status-badges';
import { can, useMe } from '../../lib/auth';
import { useTank } from '../../features/tanks/api/get-tank';
import { UrgentRequestForm } from '../../features/urgent/components/urgent-request-form';

export function UrgentNewRoute() {
  const { tankId = '' } = useParams();
  const tank = useTank(tankId);
  const { data: me } = useMe();
  // Staff open this form for a request an owner phones in; the request is the owners' all the same.
  const forOwners = can(me, 'urgent:manage');
  const title = 'Request an urgent visit';
  if (tank.isPending)
    return (
      <Page title={title}>
        <LoadingState label="Loading the tank…" />
      </Page>
    );
  if (tank.isError)
    return (
      <Page title={title}>
        <ErrorState error={tank.error} what="this tank" onRetry={() => void tank.refetch()} />
      </Page>
    );
  return (
    <Page
      title={title}
      description={
        <>
          For{' '}
          <Link to={`/tanks/${tankId}`} className="font-bold text-brine-700">
            {tank.data.name}
          </Link>
          {tank.data.siteLabel && <> · {tank.data.siteLabel}</>}
        </>
      }
    >
      <title>{`Urgent visit for ${tank.data.name} — Brinewatch`}</title>
      <div className="grid max-w-3xl grid-cols-[minmax(0,1fr)] gap-4">
        {/* Read before anything else on the form, so it stands apart from the line about the tank. */}
        <p className="flex items-start gap-3 rounded-card border-2 border-alert-700 bg-alert-100 p-4 font-bold text-ink-950">
          <StatusShape tone="alert" className="mt-0.5 h-6 w-6 text-alert-700" />
          If anyone is hurt, or there is smoke or fire, call your local emergency number first.
        </p>
        {forOwners && (
          <p className="rounded-card bg-sand-100 p-4 text-ink-900">
            You are asking on behalf of this tank&rsquo;s owners
            {tank.data.owners.length > 0 && <> ({tank.data.owners.map((owner) => owner.name).join(', ')})</>},
            for example for a request they phoned in. They see the request and every update on it, and the
            call-out fee below applies to them.
          </p>
        )}
        <UrgentRequestForm tankId={tankId} forOwners={forOwners} />
      </div>
    </Page>
  );
}

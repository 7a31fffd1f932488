import { Link, useParams } from 'react-router';
import { Page } from '../../components/page';
import { ErrorState, LoadingState } from '../../components/states';
import { useTank } from '../../features/tanks/api/get-tank';
import { UrgentRequestForm } from '../../features/urgent/components/urgent-request-form';

export function UrgentNewRoute() {
  const { tankId = '' } = useParams();
  const tank = useTank(tankId);
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
          {tank.data.siteLabel && <> · {tank.data.siteLabel}</>}. If anyone is hurt, or there is smoke or
          fire, call your local emergency number first.
        </>
      }
    >
      <title>{`Urgent visit for ${tank.data.name} — Brinewatch`}</title>
      <div className="mx-auto max-w-3xl">
        <UrgentRequestForm tankId={tankId} />
      </div>
    </Page>
  );
}

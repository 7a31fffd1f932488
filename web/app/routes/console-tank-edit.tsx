import { Link, useParams, useSearchParams } from 'react-router';
import { Page } from '../../components/page';
import { ErrorState, LoadingState } from '../../components/states';
import { useTank } from '../../features/tanks/api/get-tank';
import { useUpdateTank } from '../../features/tanks/api/update-tank';
import { TankForm } from '../../features/tanks/components/tank-form';
import { TankPhotos } from '../../features/tanks/components/tank-photos';

const linkClass =
  'inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50';

export function ConsoleTankEditRoute() {
  const { tankId = '' } = useParams();
  const [params] = useSearchParams();
  const tank = useTank(tankId);
  const updateTank = useUpdateTank(tankId);

  if (tank.isPending) {
    return (
      <Page title="Edit tank">
        <LoadingState label="Loading the tank…" />
      </Page>
    );
  }
  if (tank.isError) {
    return (
      <Page title="Edit tank">
        <ErrorState error={tank.error} what="this tank" onRetry={() => void tank.refetch()} />
      </Page>
    );
  }
  return (
    <Page
      title={`Edit ${tank.data.name}`}
      description={tank.data.siteLabel}
      actions={
        <>
          <Link to={`/tanks/${tankId}`} className={linkClass}>
            Tank page
          </Link>
          <Link to={`/console/tanks/${tankId}/livestock`} className={linkClass}>
            Livestock
          </Link>
          <Link to={`/console/tanks/${tankId}/equipment`} className={linkClass}>
            Equipment
          </Link>
        </>
      }
    >
      {(params.get('created') || updateTank.isSuccess) && (
        <p role="status" className="mb-4 rounded-lg bg-healthy-100 p-3 font-bold text-healthy-700">
          {updateTank.isSuccess
            ? 'Changes saved.'
            : 'Tank created. Add its photos, livestock and equipment next.'}
        </p>
      )}
      <div className="space-y-6">
        <TankForm
          tank={tank.data}
          submitLabel="Save changes"
          onSubmit={(input) => updateTank.mutateAsync(input)}
        />
        <TankPhotos tank={tank.data} />
      </div>
    </Page>
  );
}

import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { Page } from '../../components/page';
import { ErrorState, LoadingState } from '../../components/states';
import { useLivestock } from '../../lib/queries/livestock';
import { AddLivestockForm } from '../../features/livestock/components/add-livestock-form';
import { LivestockManager } from '../../features/livestock/components/livestock-manager';
import { NewSpeciesForm } from '../../features/livestock/components/new-species-form';
import { useTank } from '../../features/tanks/api/get-tank';

export function ConsoleTankLivestockRoute() {
  const { tankId = '' } = useParams();
  const tank = useTank(tankId);
  const livestock = useLivestock(tankId);
  const [speciesAdded, setSpeciesAdded] = useState(false);

  if (tank.isPending) {
    return (
      <Page title="Livestock">
        <LoadingState label="Loading the tank…" />
      </Page>
    );
  }
  if (tank.isError) {
    return (
      <Page title="Livestock">
        <ErrorState error={tank.error} what="this tank" onRetry={() => void tank.refetch()} />
      </Page>
    );
  }
  return (
    <Page
      title={`Livestock in ${tank.data.name}`}
      description={
        <Link to={`/tanks/${tankId}`} className="font-bold text-brine-700">
          Back to the tank page
        </Link>
      }
    >
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <div className="space-y-6">
          <AddLivestockForm tankId={tankId} waterType={tank.data.waterType} />
          <details className="rounded-card bg-white p-5 shadow-card">
            <summary className="flex min-h-11 cursor-pointer items-center text-lg font-bold text-ink-900">
              Not in the catalogue? Add your company’s own species
            </summary>
            {speciesAdded && (
              <p role="status" className="mt-2 rounded-lg bg-healthy-100 p-3 font-bold text-healthy-700">
                Species added. Find it with the search above.
              </p>
            )}
            <div className="mt-3">
              <NewSpeciesForm defaultWater={tank.data.waterType} onCreated={() => setSpeciesAdded(true)} />
            </div>
          </details>
        </div>
        <section aria-labelledby="in-tank-title">
          <h2 id="in-tank-title" className="mb-3 text-xl font-bold text-ink-900">
            In the tank
          </h2>
          {livestock.isPending ? (
            <LoadingState label="Loading livestock…" />
          ) : livestock.isError ? (
            <ErrorState
              error={livestock.error}
              what="the livestock"
              onRetry={() => void livestock.refetch()}
            />
          ) : (
            <LivestockManager
              tankId={tankId}
              livestock={livestock.data}
              timeZone={tank.data.effectiveTimeZone}
            />
          )}
        </section>
      </div>
    </Page>
  );
}

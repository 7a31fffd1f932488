import { ErrorState, LoadingState } from '../../../components/states';
import { useLivestock } from '../../../lib/queries/livestock';
import { useComfortRange } from '../../../lib/queries/comfort-range';
import { ComfortRangePanel } from './comfort-range-panel';
import { LivestockGallery } from './livestock-gallery';

/** The livestock section of a tank's page: what lives in the tank, and the water they all tolerate. */
export function TankLivestock({ tankId, timeZone }: { tankId: string; timeZone: string }) {
  const livestock = useLivestock(tankId);
  const comfort = useComfortRange(tankId);
  return (
    <>
      {livestock.isPending ? (
        <LoadingState label="Loading livestock…" />
      ) : livestock.isError ? (
        <ErrorState error={livestock.error} what="the livestock" onRetry={() => void livestock.refetch()} />
      ) : (
        <LivestockGallery livestock={livestock.data} timeZone={timeZone} />
      )}
      {comfort.data && (comfort.data.species.length > 0 || comfort.data.conflicts.length > 0) && (
        <details className="mt-4 rounded-card bg-white p-4 shadow-card">
          <summary className="flex min-h-11 cursor-pointer items-center font-bold text-ink-900">
            Comfort range: the water they all tolerate
          </summary>
          <div className="mt-2">
            <ComfortRangePanel comfort={comfort.data} />
          </div>
        </details>
      )}
    </>
  );
}

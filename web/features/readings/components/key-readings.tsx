import type { ParameterKey } from '@shared/parameters/keys';
import { ErrorState, LoadingState } from '../../../components/states';
import { relativeTime } from '../../../lib/format';
import { useLatestReadings } from '../../../lib/queries/latest-readings';
import { preferredUnit } from '../utils/display-units';
import { LatestReadings } from './latest-readings';

/**
 * The readings that decide the tank's status, for the top of its page; a tile opens that
 * parameter's chart in the readings section.
 */
export function KeyReadings({
  tankId,
  onOpen,
  more,
}: {
  tankId: string;
  onOpen: (parameter: ParameterKey) => void;
  /** The way to every reading and chart. */
  more: React.ReactNode;
}) {
  const latest = useLatestReadings(tankId);
  if (latest.isPending) return <LoadingState label="Loading the latest readings…" />;
  if (latest.isError) {
    return (
      <ErrorState error={latest.error} what="this tank's readings" onRetry={() => void latest.refetch()} />
    );
  }
  const watched = latest.data.parameters.filter((p) => p.watched);
  const shown = watched.length > 0 ? watched : latest.data.parameters;
  return (
    <section aria-labelledby="key-readings-title" className="grid gap-3">
      <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1">
        <h2 id="key-readings-title" className="text-xl font-bold text-ink-900">
          Key readings
        </h2>
        {more}
      </div>
      {shown.length === 0 ? (
        <p className="rounded-card bg-white p-4 text-ink-900 shadow-card">
          No readings yet. Readings from visits, home tests and devices appear here.
        </p>
      ) : (
        <LatestReadings
          parameters={shown}
          units={Object.fromEntries(shown.map((p) => [p.parameter, preferredUnit(p.parameter)]))}
          selected={null}
          onSelect={onOpen}
          action="Open its chart"
        />
      )}
      {latest.data.lastReadingAt && (
        <p className="text-sm text-ink-700">Last reading {relativeTime(latest.data.lastReadingAt)}</p>
      )}
    </section>
  );
}

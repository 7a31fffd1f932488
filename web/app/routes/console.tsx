import { useCallback, useMemo } from 'react';
import { Link, useSearchParams } from 'react-router';
import type { TankListQuery } from '@shared/schemas/tanks';
import { Page } from '../../components/page';
import { EmptyState, ErrorState, LoadingState } from '../../components/states';
import { useTechnicians } from '../../features/tanks/api/get-technicians';
import { TankFilters } from '../../features/tanks/components/tank-filters';
import { TankTable } from '../../features/tanks/components/tank-table';
import { useTanks } from '../../lib/queries/tanks';

/** Every client tank the company looks after; the filters live in the address, so a reload keeps them. */
export function ConsoleHomeRoute() {
  const [params, setParams] = useSearchParams();
  const query = useMemo<TankListQuery>(
    () => ({
      q: params.get('q') ?? undefined,
      technicianId: (params.get('technicianId') ?? undefined) as TankListQuery['technicianId'],
    }),
    [params],
  );
  const onChange = useCallback(
    (next: TankListQuery) => {
      const search = new URLSearchParams();
      if (next.q) search.set('q', next.q);
      if (next.technicianId) search.set('technicianId', next.technicianId);
      setParams(search, { replace: true });
    },
    [setParams],
  );
  const tanks = useTanks(query);
  const technicians = useTechnicians();
  const filtered = Boolean(query.q || query.technicianId);
  const clientCount = new Set(tanks.data?.flatMap((tank) => tank.owners.map((owner) => owner.id))).size;

  return (
    <Page
      title="Clients and tanks"
      description="Every client tank your company looks after."
      actions={
        <Link
          to="/console/tanks/new"
          className="inline-flex min-h-11 items-center rounded-lg bg-brine-700 px-4 font-bold text-white no-underline hover:bg-brine-600"
        >
          New tank
        </Link>
      }
    >
      <TankFilters query={query} technicians={technicians.data ?? []} onChange={onChange} />
      <div className="mt-4" aria-live="polite">
        {tanks.isPending ? (
          <LoadingState label="Loading tanks…" />
        ) : tanks.isError ? (
          <ErrorState error={tanks.error} what="the tanks" onRetry={() => void tanks.refetch()} />
        ) : tanks.data.length === 0 ? (
          <EmptyState title={filtered ? 'No tank matches' : 'No tanks yet'}>
            {filtered
              ? 'Try another name, or choose everyone.'
              : 'Add the first client tank with “New tank”.'}
          </EmptyState>
        ) : (
          <>
            <p className="mb-3 text-sm text-ink-700">
              {tanks.data.length} {tanks.data.length === 1 ? 'tank' : 'tanks'} for {clientCount}{' '}
              {clientCount === 1 ? 'client' : 'clients'}
            </p>
            <TankTable tanks={tanks.data} />
          </>
        )}
      </div>
    </Page>
  );
}

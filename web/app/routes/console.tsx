import { useCallback, useMemo } from 'react';
import { Link, useSearchParams } from 'react-router';
import type { TankListQuery } from '@shared/schemas/tanks';
import { Page } from '../../components/page';
import { EmptyState, ErrorState, LoadingState } from '../../components/states';
import { useTechnicians } from '../../lib/queries/technicians';
import { TankFilters } from '../../features/tanks/components/tank-filters';
import { TankTable } from '../../features/tanks/components/tank-table';
import { byTrouble } from '../../features/tanks/utils/trouble-order';
import { can, useMe } from '../../lib/auth';
import { useTanks } from '../../lib/queries/tanks';

/** In the address, "everyone" is the explicit choice; no choice at all means the person's own tanks. */
const everyone = 'everyone';

const toggleClass = (active: boolean) =>
  `inline-flex min-h-11 items-center rounded-lg border-2 px-4 font-bold no-underline ${
    active
      ? 'border-ink-800 bg-ink-800 text-white'
      : 'border-ink-300 bg-white text-ink-900 hover:border-ink-700'
  }`;

/**
 * Every client tank the company looks after, worst first. A technician opens on their own tanks
 * and an admin on everyone's, the other one tap away; the filters live in the address, so a reload keeps them.
 */
export function ConsoleHomeRoute() {
  const [params, setParams] = useSearchParams();
  const { data: me } = useMe();
  const chosen = params.get('technicianId');
  const query = useMemo<TankListQuery>(
    () => ({
      q: params.get('q') ?? undefined,
      // A technician opens on their own round; whoever oversees the staff opens on every tank.
      technicianId: (chosen === null
        ? can(me, 'staff:read')
          ? undefined
          : me?.id
        : chosen === everyone
          ? undefined
          : chosen) as TankListQuery['technicianId'],
    }),
    [params, chosen, me],
  );
  const mine = me !== undefined && me !== null && query.technicianId === me.id;
  const onChange = useCallback(
    (next: TankListQuery) => {
      const search = new URLSearchParams();
      if (next.q) search.set('q', next.q);
      search.set('technicianId', next.technicianId ?? everyone);
      setParams(search, { replace: true });
    },
    [setParams],
  );
  const withWho = (technicianId: string) => {
    const search = new URLSearchParams();
    if (query.q) search.set('q', query.q);
    search.set('technicianId', technicianId);
    return `?${search}`;
  };
  const tanks = useTanks(query);
  const technicians = useTechnicians();
  const filtered = Boolean(query.q || (query.technicianId && !mine));
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
      {me && (
        <nav aria-label="Whose tanks" className="mb-3">
          <ul className="flex flex-wrap gap-2">
            <li>
              <Link
                to={withWho(me.id)}
                replace
                className={toggleClass(mine)}
                aria-current={mine ? 'page' : undefined}
              >
                My tanks
              </Link>
            </li>
            <li>
              <Link
                to={withWho(everyone)}
                replace
                className={toggleClass(query.technicianId === undefined)}
                aria-current={query.technicianId === undefined ? 'page' : undefined}
              >
                Everyone
              </Link>
            </li>
          </ul>
        </nav>
      )}
      {/* A new key when the toggle above changes who is shown, so the form starts from the address. */}
      <TankFilters
        key={mine ? 'mine' : (query.technicianId ?? everyone)}
        query={query}
        technicians={technicians.data ?? []}
        onChange={onChange}
      />
      <div className="mt-4" aria-live="polite">
        {tanks.isPending ? (
          <LoadingState label="Loading tanks…" />
        ) : tanks.isError ? (
          <ErrorState error={tanks.error} what="the tanks" onRetry={() => void tanks.refetch()} />
        ) : tanks.data.length === 0 ? (
          <EmptyState
            title={filtered ? 'No tank matches' : mine ? 'No tanks assigned to you' : 'No tanks yet'}
          >
            {filtered || mine
              ? 'Try another name, or choose everyone.'
              : 'Add the first client tank with “New tank”.'}
          </EmptyState>
        ) : (
          <>
            <p className="mb-3 text-sm text-ink-700">
              {tanks.data.length} {tanks.data.length === 1 ? 'tank' : 'tanks'} for {clientCount}{' '}
              {clientCount === 1 ? 'client' : 'clients'}
            </p>
            <TankTable tanks={byTrouble(tanks.data)} />
          </>
        )}
      </div>
    </Page>
  );
}

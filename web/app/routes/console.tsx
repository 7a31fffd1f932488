import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { Link, useLocation, useSearchParams } from 'react-router';
import { Page } from '../../components/page';
import { EmptyState, ErrorState, LoadingState } from '../../components/states';
import { useTechnicians } from '../../lib/queries/technicians';
import {
  matchingTankCount,
  useTankOverview,
  type TankOverviewFilters,
} from '../../features/tanks/api/get-tank-overview';
import { TankFilters } from '../../features/tanks/components/tank-filters';
import { TankTable } from '../../features/tanks/components/tank-table';
import {
  everyone,
  narrowsOverview,
  overviewFilters,
  overviewSearch,
  readOverviewAddress,
  type OverviewAddress,
} from '../../features/tanks/utils/overview-address';
import { can, useMe } from '../../lib/auth';
import { formatCount } from '../../lib/format';

const toggleClass = (active: boolean) =>
  `inline-flex min-h-11 items-center rounded-lg border-2 px-4 font-bold no-underline ${
    active
      ? 'border-ink-800 bg-ink-800 text-white'
      : 'border-ink-300 bg-white text-ink-900 hover:border-ink-700'
  }`;

const buttonClass =
  'inline-flex min-h-11 items-center justify-center rounded-lg border-2 border-brine-700 bg-white px-4 font-bold text-brine-700 hover:bg-brine-100 aria-disabled:cursor-wait aria-disabled:opacity-70';

/** Marks an address change the filter form made itself, so the form is not rebuilt under the cursor. */
const fromFilters = { fromFilters: true };

const plural = (count: number, one: string, many: string) =>
  `${formatCount(count)} ${count === 1 ? one : many}`;

/**
 * Every client tank the company looks after, worst first and longest in trouble first, 50 at a time
 * from the API. A technician opens on their own tanks and an admin on everyone's, the other one tap
 * away; the filters live in the address, so a link or a reload keeps them.
 */
export function ConsoleHomeRoute() {
  const [params, setParams] = useSearchParams();
  const location = useLocation();
  const { data: me, isPending: meLoading } = useMe();
  const address = useMemo(() => readOverviewAddress(params), [params]);
  // A technician opens on their own round; whoever oversees the staff opens on every tank.
  const ownDefault = can(me, 'staff:read') ? undefined : me?.id;
  const query = useMemo(() => overviewFilters(address, ownDefault), [address, ownDefault]);
  const mine = me != null && query.technicianId === me.id;
  const narrowed = narrowsOverview(address, me?.id);

  // The form starts again from the address whenever something other than the form changed it.
  const [formKey, setFormKey] = useState(location.key);
  const changedByForm = (location.state as typeof fromFilters | null)?.fromFilters === true;
  if (!changedByForm && formKey !== location.key) setFormKey(location.key);

  const onChange = useCallback(
    (next: TankOverviewFilters) => {
      const search = overviewSearch({
        q: next.q,
        technician: next.technicianId ?? everyone,
        status: next.status ?? [],
        style: next.style,
      });
      setParams(search, { replace: true, state: fromFilters });
    },
    [setParams],
  );
  const linkTo = (changes: Partial<OverviewAddress>) => `?${overviewSearch({ ...address, ...changes })}`;
  const cleared = linkTo({
    q: undefined,
    status: [],
    style: undefined,
    technician: mine && me ? me.id : everyone,
  });

  // Until the person is known, "no choice" cannot be told apart from "everyone".
  const tanks = useTankOverview(query, { enabled: !(address.technician === null && meLoading) });
  const technicians = useTechnicians();
  const list = useRef<HTMLDivElement>(null);
  const data = tanks.data;

  // After "Show more tanks" the reader is taken to the first tank it brought, not left below the
  // list (or on nothing, once the button goes with the last page).
  const focusFrom = useRef<number | null>(null);
  const showMore = () => {
    focusFrom.current = data?.tanks.length ?? null;
    void tanks.fetchNextPage();
  };
  useEffect(() => {
    const tank = focusFrom.current === null ? undefined : data?.tanks[focusFrom.current];
    if (!tank || !list.current) return;
    focusFrom.current = null;
    const links = list.current.querySelectorAll<HTMLAnchorElement>(`a[href="/tanks/${tank.id}"]`);
    // The phone's cards and the desk's table are both in the page; only one is shown.
    [...links].find((link) => link.offsetParent !== null)?.focus();
  }, [data]);

  const total = data ? matchingTankCount(data.counts, query.status) : 0;
  const clientCount = new Set(data?.tanks.flatMap((tank) => tank.owners.map((owner) => owner.id))).size;

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
                to={linkTo({ technician: me.id })}
                replace
                className={toggleClass(mine)}
                aria-current={mine ? 'page' : undefined}
              >
                My tanks
              </Link>
            </li>
            <li>
              <Link
                to={linkTo({ technician: everyone })}
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
      <TankFilters
        key={formKey}
        query={query}
        technicians={technicians.data ?? []}
        counts={data?.counts}
        onChange={onChange}
      />
      <div className="mt-4" ref={list}>
        {tanks.isPending ? (
          <LoadingState label="Loading tanks…" />
        ) : tanks.isError && !data ? (
          <ErrorState error={tanks.error} what="the tanks" onRetry={() => void tanks.refetch()} />
        ) : !data || data.tanks.length === 0 ? (
          narrowed ? (
            <EmptyState title="No tanks match these filters">
              <Link
                to={cleared}
                replace
                className="inline-flex min-h-11 items-center font-bold text-brine-700"
              >
                Clear the filters
              </Link>
            </EmptyState>
          ) : (
            <EmptyState title={mine ? 'No tanks assigned to you' : 'No tanks yet'}>
              {mine
                ? 'Choose everyone to see every client tank.'
                : 'Add the first client tank with “New tank”.'}
            </EmptyState>
          )
        ) : (
          <>
            <p className="mb-3 text-sm text-ink-700" role="status">
              {data.complete
                ? `${plural(data.tanks.length, 'tank', 'tanks')} for ${plural(clientCount, 'client', 'clients')}`
                : `Showing ${formatCount(data.tanks.length)} of ${plural(total, 'tank', 'tanks')}, worst first`}
            </p>
            <TankTable tanks={data.tanks} />
            {tanks.isFetchNextPageError && (
              <div className="mt-3">
                <ErrorState error={tanks.error} what="more tanks" onRetry={showMore} />
              </div>
            )}
            {tanks.hasNextPage && !tanks.isFetchNextPageError && (
              <div className="mt-4 flex justify-center">
                <button
                  type="button"
                  className={buttonClass}
                  aria-disabled={tanks.isFetchingNextPage || undefined}
                  onClick={() => {
                    if (!tanks.isFetchingNextPage) showMore();
                  }}
                >
                  {tanks.isFetchingNextPage ? 'Loading more tanks…' : 'Show more tanks'}
                </button>
              </div>
            )}
          </>
        )}
      </div>
    </Page>
  );
}

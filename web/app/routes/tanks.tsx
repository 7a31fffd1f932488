import { Page } from '../../components/page';
import { EmptyState, ErrorState, LoadingState } from '../../components/states';
import { TankCard } from '../../features/tanks/components/tank-card';
import { byTrouble } from '../../features/tanks/utils/trouble-order';
import { useTanks } from '../../lib/queries/tanks';
import { useMe } from '../../lib/auth';
import { DashboardTipsFeed } from '../../features/care-tips/components/tip-feed';

export function MyTanksRoute() {
  const tanks = useTanks();
  const { data: me } = useMe();
  return (
    <Page
      title="My tanks"
      description="Tanks that need you come first. Open one for its readings, livestock and equipment."
    >
      {tanks.isPending ? (
        <LoadingState label="Loading your tanks…" />
      ) : tanks.isError ? (
        <ErrorState error={tanks.error} what="your tanks" onRetry={() => void tanks.refetch()} />
      ) : tanks.data.length === 0 ? (
        <EmptyState title="No tanks yet">
          Your service company adds your tanks and invites you to them.
        </EmptyState>
      ) : (
        <ul className="grid items-start gap-3 sm:grid-cols-2 sm:gap-4 lg:grid-cols-3">
          {byTrouble(tanks.data).map((tank) => (
            <li key={tank.id}>
              <TankCard tank={tank} />
            </li>
          ))}
        </ul>
      )}
      {me && tanks.data && tanks.data.length > 0 && (
        <div className="mt-8">
          <DashboardTipsFeed companyName={me.company.name} />
        </div>
      )}
    </Page>
  );
}

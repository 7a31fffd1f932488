import { Page } from '../../components/page';
import { EmptyState, ErrorState, LoadingState } from '../../components/states';
import { TankCard } from '../../features/tanks/components/tank-card';
import { byTrouble } from '../../features/tanks/utils/trouble-order';
import { useTanks } from '../../lib/queries/tanks';

export function MyTanksRoute() {
  const tanks = useTanks();
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
    </Page>
  );
}

import { Page } from '../../components/page';
import { EmptyState, ErrorState, LoadingState } from '../../components/states';
import { TankCard } from '../../features/tanks/components/tank-card';
import { useTanks } from '../../lib/queries/tanks';

export function MyTanksRoute() {
  const tanks = useTanks();
  return (
    <Page
      title="My tanks"
      description="Each tank's health at a glance. Open one for its readings, livestock and equipment."
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
        <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
          {tanks.data.map((tank) => (
            <li key={tank.id}>
              <TankCard tank={tank} />
            </li>
          ))}
        </ul>
      )}
    </Page>
  );
}

import { Page } from '../../components/page';
import { EmptyState, ErrorState, LoadingState } from '../../components/states';
import { TankCard } from '../../features/tanks/components/tank-card';
import { byTrouble } from '../../features/tanks/utils/trouble-order';
import { useTanks } from '../../lib/queries/tanks';
import { useMe } from '../../lib/auth';
import { DashboardTipsFeed } from '../../features/care-tips/components/tip-feed';
import { useUnreadCounts } from '../../features/conversations/api/get-unread';
import { TankUnreadLine } from '../../features/conversations/components/tank-messages-link';
import { RequestUrgentVisitAction } from '../../features/urgent/components/request-urgent-visit-action';

export function MyTanksRoute() {
  const tanks = useTanks();
  const { data: me } = useMe();
  const unread = useUnreadCounts();
  return (
    <Page
      title="My tanks"
      description="Tanks that need you come first. Open one for its readings, livestock and equipment."
      actions={<RequestUrgentVisitAction tanks={tanks.data ?? []} />}
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
              <TankCard
                tank={tank}
                footer={<TankUnreadLine tankId={tank.id} unread={unread.data?.byTank[tank.id] ?? 0} />}
              />
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

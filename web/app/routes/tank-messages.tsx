import { Link, useParams } from 'react-router';
import { Page } from '../../components/page';
import { ErrorState, LoadingState } from '../../components/states';
import { ConversationThread } from '../../features/conversations/components/conversation-thread';
import { useTank } from '../../features/tanks/api/get-tank';
import { can, useMe } from '../../lib/auth';

/** A tank's conversation: owners and staff write to each other about this one tank. */
export function TankMessagesRoute() {
  const { tankId = '' } = useParams();
  const tank = useTank(tankId);
  const { data: me } = useMe();
  const isStaff = can(me, 'conversations:inbox');
  if (tank.isPending) {
    return (
      <Page title="Messages">
        <LoadingState label="Loading the tank…" />
      </Page>
    );
  }
  if (tank.isError) {
    return (
      <Page title="Messages">
        <ErrorState error={tank.error} what="this tank" onRetry={() => void tank.refetch()} />
      </Page>
    );
  }
  const owners = tank.data.owners.map((owner) => owner.name).join(', ');
  return (
    <Page
      title={`Messages: ${tank.data.name}`}
      description={
        isStaff
          ? owners
            ? `With ${owners}. Times are the tank’s.`
            : 'This tank has no owner yet.'
          : `With ${tank.data.company.name}. Times are the tank’s.`
      }
      actions={
        <>
          {isStaff && (
            <Link
              to="/console/inbox"
              className="inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50"
            >
              Inbox
            </Link>
          )}
          <Link
            to={`/tanks/${tankId}`}
            className="inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50"
          >
            Tank page
          </Link>
        </>
      }
    >
      <div className="max-w-3xl">
        <ConversationThread tankId={tankId} timeZone={tank.data.effectiveTimeZone} />
      </div>
    </Page>
  );
}

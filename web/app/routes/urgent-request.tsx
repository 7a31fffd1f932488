import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, useLocation, useParams } from 'react-router';
import { Page } from '../../components/page';
import { ErrorState, LoadingState } from '../../components/states';
import { can, useMe } from '../../lib/auth';
import { urgentKeys } from '../../lib/query-keys';
import { ConversationThread } from '../../features/conversations/components/conversation-thread';
import { useUrgentRequest } from '../../features/urgent/api/get-urgent-request';
import { UrgentActions } from '../../features/urgent/components/urgent-actions';
import { UrgentRequestDetail } from '../../features/urgent/components/urgent-request-detail';
import type { RequestSentNotice } from '../../features/urgent/components/urgent-request-form';

/**
 * One urgent visit request, for its owners and for staff: where it stands (live through the event
 * stream), what was reported, staff's next moves, and the tank's conversation under it.
 */
export function UrgentRequestRoute() {
  const { requestId = '' } = useParams();
  const location = useLocation();
  const queryClient = useQueryClient();
  const request = useUrgentRequest(requestId);
  const { data: me } = useMe();
  const isStaff = can(me, 'urgent:manage');
  const [conflict, setConflict] = useState(false);
  const arrived = (location.state as RequestSentNotice | null)?.notice ?? null;
  const title = 'Urgent visit request';

  if (request.isPending)
    return (
      <Page title={title}>
        <LoadingState label="Loading the request…" />
      </Page>
    );
  if (request.isError)
    return (
      <Page title={title}>
        <ErrorState error={request.error} what="this urgent request" onRetry={() => void request.refetch()} />
      </Page>
    );
  const data = request.data;
  return (
    <Page
      title={title}
      description={
        <>
          For{' '}
          <Link to={`/tanks/${data.tankId}`} className="font-bold text-brine-700">
            {data.tankName}
          </Link>
        </>
      }
      actions={
        isStaff ? (
          <Link
            to="/console/urgent"
            className="inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50"
          >
            All urgent requests
          </Link>
        ) : undefined
      }
    >
      <title>{`Urgent visit for ${data.tankName} — Brinewatch`}</title>
      <div className="grid grid-cols-[minmax(0,1fr)] gap-4">
        {/* Said on arrival from the form, until the request moves on. */}
        {arrived && data.status === 'requested' && (
          <p role="status" className="rounded-card bg-healthy-100 p-4 font-bold text-healthy-700">
            {arrived}
          </p>
        )}
        {conflict && (
          <div role="alert" className="rounded-card border-2 border-watch-700 bg-watch-100 p-4 text-ink-950">
            <p className="font-bold">Someone else already moved this request.</p>
            <p className="mt-1">
              The page now shows where it stands; choose again if something is still needed.
            </p>
          </div>
        )}
        <UrgentRequestDetail
          request={data}
          isStaff={isStaff}
          actions={
            isStaff ? (
              <UrgentActions
                request={data}
                meId={me?.id ?? null}
                onConflict={() => {
                  setConflict(true);
                  void queryClient.invalidateQueries({ queryKey: urgentKeys.detail(requestId) });
                }}
              />
            ) : undefined
          }
        />
        <section aria-labelledby="urgent-messages-title" className="grid gap-2">
          <h2 id="urgent-messages-title" className="text-xl font-bold text-ink-900">
            Messages
          </h2>
          <p className="text-sm text-ink-700">
            {isStaff
              ? 'The tank’s conversation with its owners; lines written here are marked as about this request.'
              : 'Write to the team here; they answer in this conversation.'}
          </p>
          <ConversationThread tankId={data.tankId} urgentRequestId={data.id} timeZone={data.timeZone} />
        </section>
      </div>
    </Page>
  );
}

import { Link } from 'react-router';
import type { DeliveryView } from '@shared/schemas/on-call';
import { Badge } from '../../../components/badge';
import { ErrorState, LoadingState } from '../../../components/states';
import { formatDateTime } from '../../../lib/format';
import { useFailedDeliveries } from '../api/list-failed-deliveries';

const channelLabels: Record<DeliveryView['channel'], string> = {
  push: 'Push notification',
  email: 'E-mail',
  'in-app': 'In the app',
};

/** Notifications that ran out of retries: someone should ring the person instead. */
export function FailedDeliveries() {
  const deliveries = useFailedDeliveries();
  return (
    <section aria-labelledby="failed-deliveries-title" className="rounded-card bg-white shadow-card">
      <div className="p-4 pb-0">
        <h2 id="failed-deliveries-title" className="text-xl font-bold text-ink-900">
          Failed deliveries
        </h2>
        <p className="mt-1 text-sm text-ink-700">
          Notifications that could not be delivered after every retry. Call the person if it matters, and
          always for an urgent visit request.
        </p>
      </div>
      <div className="mt-2">
        {deliveries.isPending ? (
          <div className="p-4">
            <LoadingState label="Loading deliveries…" />
          </div>
        ) : deliveries.isError ? (
          <div className="p-4">
            <ErrorState
              error={deliveries.error}
              what="the failed deliveries"
              onRetry={() => void deliveries.refetch()}
            />
          </div>
        ) : deliveries.data.length === 0 ? (
          <p className="p-4 text-ink-700">
            None. Every notification so far has been delivered or is on its way.
          </p>
        ) : (
          <ul className="divide-y divide-ink-100">
            {deliveries.data.map((delivery) => (
              <li key={delivery.id} className="p-4">
                <p className="font-bold text-ink-900">
                  {channelLabels[delivery.channel]} to {delivery.recipient}
                </p>
                <p className="text-sm text-ink-900">
                  {delivery.kind === 'urgent' && (
                    <Badge
                      size="sm"
                      tone="mr-1 border border-alert-700/40 bg-white text-alert-700"
                      mark={<span>▲</span>}
                    >
                      Follow up now
                    </Badge>
                  )}
                  <Link to={delivery.link} className="font-bold text-brine-700 underline underline-offset-2">
                    {delivery.about}
                  </Link>
                  {delivery.tankName !== null && <> · {delivery.tankName}</>}
                </p>
                <p className="text-sm text-ink-700">
                  {formatDateTime(delivery.createdAt)} · {delivery.attempts}{' '}
                  {delivery.attempts === 1 ? 'try' : 'tries'}
                </p>
                {delivery.lastError && (
                  <p className="mt-1 break-words text-sm text-alert-700">{delivery.lastError}</p>
                )}
              </li>
            ))}
          </ul>
        )}
      </div>
    </section>
  );
}

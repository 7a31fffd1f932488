import { useQuery } from '@tanstack/react-query';
import type { TankSummary } from '@shared/schemas/tanks';
import { Page } from '../../components/page';
import { EmptyState, ErrorState, LoadingState } from '../../components/states';
import { api } from '../../lib/api-client';

export function ConsoleHomeRoute() {
  const tanks = useQuery({
    queryKey: ['tanks'],
    queryFn: ({ signal }) => api<TankSummary[]>('/tanks', { signal }),
  });
  return (
    <Page title="Company console" description="Every client tank your company looks after.">
      {tanks.isPending ? (
        <LoadingState label="Loading tanks…" />
      ) : tanks.isError ? (
        <ErrorState error={tanks.error} what="the tanks" onRetry={() => void tanks.refetch()} />
      ) : tanks.data.length === 0 ? (
        <EmptyState title="No tanks yet" />
      ) : (
        <ul className="divide-y divide-ink-100 rounded-card bg-white shadow-card">
          {tanks.data.map((tank) => (
            <li key={tank.id} className="p-4">
              <p className="font-bold text-ink-900">{tank.name}</p>
              {tank.siteLabel && <p className="text-sm text-ink-700">{tank.siteLabel}</p>}
            </li>
          ))}
        </ul>
      )}
    </Page>
  );
}

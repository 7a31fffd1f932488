import { useQuery } from '@tanstack/react-query';
import type { TankSummary } from '@shared/schemas/tanks';
import { Page } from '../../components/page';
import { EmptyState, ErrorState, LoadingState } from '../../components/states';
import { api } from '../../lib/api-client';

export function MyTanksRoute() {
  const tanks = useQuery({
    queryKey: ['tanks'],
    queryFn: ({ signal }) => api<TankSummary[]>('/tanks', { signal }),
  });
  return (
    <Page title="My tanks">
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
            <li key={tank.id} className="rounded-card bg-white p-5 shadow-card">
              <h2 className="font-bold text-ink-900">{tank.name}</h2>
              {tank.siteLabel && <p className="mt-1 text-sm text-ink-700">{tank.siteLabel}</p>}
            </li>
          ))}
        </ul>
      )}
    </Page>
  );
}

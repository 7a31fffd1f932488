import { useDeferredValue, useId, useState } from 'react';
import type { ClientSummary } from '@shared/schemas/users';
import { AccountStatusBadge } from '../../../components/badges';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { useClients } from '../../../lib/queries/people';
import { AccountStatusAction } from './account-status-action';

const fold = (text: string) => text.normalize('NFKD').replace(/\p{M}/gu, '').toLocaleLowerCase();

function matches(client: ClientSummary, query: string) {
  const words = fold(query).split(/\s+/).filter(Boolean);
  const haystack = fold([client.name, client.email, ...client.tanks.map((tank) => tank.name)].join(' '));
  return words.every((word) => haystack.includes(word));
}

function ClientRow({
  client,
  canManage,
  onDone,
}: {
  client: ClientSummary;
  canManage: boolean;
  onDone: (message: string) => void;
}) {
  return (
    <li className="flex flex-col gap-3 p-4 sm:flex-row sm:flex-wrap sm:items-center sm:justify-between">
      <div className="min-w-0">
        <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <h3 className="font-bold text-ink-900">{client.name}</h3>
          <AccountStatusBadge status={client.status} />
        </div>
        <p className="break-all text-sm text-ink-700">{client.email}</p>
        {client.tanks.length === 0 ? (
          <p className="mt-2 text-sm text-ink-700">Not following any tank yet.</p>
        ) : (
          <ul aria-label={`Tanks ${client.name} follows`} className="mt-2 flex flex-wrap gap-2">
            {client.tanks.map((tank) => (
              <li
                key={tank.id}
                className="rounded-md bg-brine-100 px-2.5 py-1 text-sm font-bold text-ink-900"
              >
                {tank.name}
              </li>
            ))}
          </ul>
        )}
      </div>
      {canManage && (
        <div className="flex flex-wrap gap-2">
          <AccountStatusAction
            person={client}
            kept="Their tanks and readings stay as they are."
            onDone={onDone}
          />
        </div>
      )}
    </li>
  );
}

export function ClientList({ canManage }: { canManage: boolean }) {
  const clients = useClients();
  const [query, setQuery] = useState('');
  const deferredQuery = useDeferredValue(query);
  const [announcement, setAnnouncement] = useState('');
  const searchId = useId();

  const shown = clients.data?.filter((client) => matches(client, deferredQuery)) ?? [];
  const total = clients.data?.length ?? 0;
  const searching = deferredQuery.trim() !== '';

  return (
    <section aria-labelledby="clients-title">
      <h2 id="clients-title" className="text-xl font-bold text-ink-900">
        All clients
      </h2>
      <div className="mt-3">
        <label htmlFor={searchId} className="block font-bold text-ink-900">
          Search clients
        </label>
        <p id={`${searchId}-hint`} className="mt-1 text-sm text-ink-700">
          By name, e-mail address or tank.
        </p>
        <input
          id={searchId}
          type="search"
          autoComplete="off"
          spellCheck={false}
          value={query}
          onChange={(event) => {
            setQuery(event.target.value);
            setAnnouncement('');
          }}
          aria-describedby={`${searchId}-hint`}
          className="mt-2 min-h-12 w-full rounded-lg border-2 border-ink-300 bg-white px-3 text-base text-ink-950 focus:border-ink-700"
        />
      </div>
      <p role="status" className="text-sm font-bold text-ink-700 not-empty:mt-2">
        {announcement || (clients.isSuccess && searching ? `${shown.length} of ${total} clients match.` : '')}
      </p>
      <div className="mt-2">
        {clients.isPending ? (
          <LoadingState label="Loading clients…" />
        ) : clients.isError ? (
          <ErrorState error={clients.error} what="the clients" onRetry={() => void clients.refetch()} />
        ) : total === 0 ? (
          <EmptyState title="No clients yet">
            {canManage
              ? 'Invite the owner of a tank with the form on this page.'
              : 'An admin invites clients to their tanks.'}
          </EmptyState>
        ) : shown.length === 0 ? (
          <EmptyState title={`No client matches “${deferredQuery.trim()}”`}>
            Check the spelling, or search by e-mail address or tank name.
          </EmptyState>
        ) : (
          <ul className="divide-y divide-ink-100 rounded-card bg-white shadow-card">
            {shown.map((client) => (
              <ClientRow
                key={client.id}
                client={client}
                canManage={canManage}
                onDone={(message) => setAnnouncement(message)}
              />
            ))}
          </ul>
        )}
      </div>
    </section>
  );
}

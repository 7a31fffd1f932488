import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Invitation } from '@shared/schemas/invitations';
import { api } from '../../../lib/api-client';
import { peopleKeys } from '../../../lib/query-keys';

/** Newest first, every status; staff and client invitations together. */
export const getInvitations = (signal?: AbortSignal) => api<Invitation[]>('/invitations', { signal });

export const invitationsQueryOptions = () =>
  queryOptions({ queryKey: peopleKeys.invitations(), queryFn: ({ signal }) => getInvitations(signal) });

export const useInvitations = () => useQuery(invitationsQueryOptions());

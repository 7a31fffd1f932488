import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TankChoice } from '@shared/schemas/tanks';
import { api } from '../api-client';
import { tankKeys } from '../query-keys';

/*
 * Every tank the signed-in person may see, by name, with its site and owners: what the alerts
 * board's filter, care tips, the schedule's plan-a-visit form and the client invitation need. The
 * full list (./tanks.ts) judges every tank's health, too heavy to fill a picker.
 */

export const getTankChoices = (signal?: AbortSignal) => api<TankChoice[]>('/tanks/choices', { signal });

export const tankChoicesQueryOptions = () =>
  queryOptions({ queryKey: tankKeys.choices(), queryFn: ({ signal }) => getTankChoices(signal) });

export const useTankChoices = () => useQuery(tankChoicesQueryOptions());

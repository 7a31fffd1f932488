import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CareTip, TipReach } from '@shared/schemas/care-tips';
import { api } from '../../../lib/api-client';
import { tipKeys } from '../../../lib/query-keys';

export const getCareTip = (tipId: string, signal?: AbortSignal) =>
  api<CareTip>(`/care-tips/${tipId}`, { signal });

export const careTipQueryOptions = (tipId: string) =>
  queryOptions({ queryKey: tipKeys.detail(tipId), queryFn: ({ signal }) => getCareTip(tipId, signal) });

export const useCareTip = (tipId: string) => useQuery(careTipQueryOptions(tipId));

/** The tanks and owners a tip reached, and who found it helpful. */
export const getTipReach = (tipId: string, signal?: AbortSignal) =>
  api<TipReach>(`/care-tips/${tipId}/reach`, { signal });

export const tipReachQueryOptions = (tipId: string) =>
  queryOptions({ queryKey: tipKeys.reach(tipId), queryFn: ({ signal }) => getTipReach(tipId, signal) });

export const useTipReach = (tipId: string, enabled = true) =>
  useQuery({ ...tipReachQueryOptions(tipId), enabled });

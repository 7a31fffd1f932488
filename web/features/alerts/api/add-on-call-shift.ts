import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { OnCallShiftInput, OnCallShiftView } from '@shared/schemas/on-call';
import { api } from '../../../lib/api-client';
import { onCallQueryKey } from './on-call-query-keys';

/** Answers with the roster as it now stands. */
export const addOnCallShift = (input: OnCallShiftInput) =>
  api<OnCallShiftView[]>('/on-call', { method: 'POST', body: input });

export const useAddOnCallShift = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: addOnCallShift,
    onSuccess: (roster) => queryClient.setQueryData(onCallQueryKey, roster),
  });
};

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { OnCallShiftInput, OnCallShiftView } from '@shared/schemas/on-call';
import { api } from '../../../lib/api-client';
import { onCallKeys } from '../../../lib/query-keys';

/** Answers with the roster as it now stands. */
export const addOnCallShift = (input: OnCallShiftInput) =>
  api<OnCallShiftView[]>('/on-call', { method: 'POST', body: input });

export const useAddOnCallShift = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: addOnCallShift,
    onSuccess: (roster) => queryClient.setQueryData(onCallKeys.all, roster),
  });
};

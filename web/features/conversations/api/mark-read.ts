import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { conversationKeys } from '../../../lib/query-keys';

/** Moves my read position forward to `messageId` (never back: the server keeps the later one). */
export const markConversationRead = (tankId: string, messageId: string) =>
  api<void>(`/tanks/${tankId}/conversation/read`, { method: 'POST', body: { messageId } });

/**
 * After a read, the counts (header, tank page, inbox) refresh; the thread itself does not, as
 * nothing in it changed.
 */
export function useMarkConversationRead(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (messageId: string) => markConversationRead(tankId, messageId),
    onSuccess: () =>
      queryClient.invalidateQueries({
        queryKey: conversationKeys.all,
        predicate: (query) => query.queryKey[1] !== 'thread',
      }),
  });
}

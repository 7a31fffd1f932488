import type { InfiniteData, QueryClient } from '@tanstack/react-query';
import type { MessageInput, MessagePage, MessageView } from '@shared/schemas/conversations';
import type { PhotoItem } from '@shared/schemas/photos';
import { api } from '../../../lib/api-client';
import { conversationKeys } from '../../../lib/query-keys';

/**
 * Posts a message. `idempotencyKey` belongs to the draft, not to the attempt: a retry after a lost
 * answer sends the same key, and the server returns the message it already stored instead of a
 * second copy.
 */
export const sendMessage = (tankId: string, input: MessageInput, idempotencyKey: string) =>
  api<MessageView>(`/tanks/${tankId}/conversation/messages`, {
    method: 'POST',
    body: input,
    headers: { 'Idempotency-Key': idempotencyKey },
  });

/** A photo for a message (or an urgent request), uploaded before the message is sent. */
export function uploadMessagePhoto(tankId: string, file: Blob) {
  const form = new FormData();
  form.append('photo', file);
  return api<PhotoItem>(`/tanks/${tankId}/conversation/photos`, { method: 'POST', body: form });
}

type ThreadData = InfiniteData<MessagePage, string | null>;

/**
 * Shows a sent message at once at the end of the newest page (once, even if the live refresh got
 * there first), then lets the server's answer settle the thread and the counts.
 */
export function showSentMessage(queryClient: QueryClient, tankId: string, message: MessageView) {
  queryClient.setQueryData<ThreadData>(conversationKeys.thread(tankId), (data) => {
    const [newest, ...older] = data?.pages ?? [];
    if (!data || !newest || newest.messages.some((m) => m.id === message.id)) return data;
    return { ...data, pages: [{ ...newest, messages: [...newest.messages, message] }, ...older] };
  });
  void queryClient.invalidateQueries({ queryKey: conversationKeys.all });
}

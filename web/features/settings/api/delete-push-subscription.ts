import { api } from '../../../lib/api-client';

export const deletePushSubscription = (endpoint: string) =>
  api<void>('/push/subscriptions', { method: 'DELETE', body: { endpoint } });

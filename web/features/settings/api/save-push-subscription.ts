import type { PushSubscriptionInput } from '@shared/schemas/notifications';
import { api } from '../../../lib/api-client';

/** The same endpoint subscribing again replaces its keys, so repeating this is harmless. */
export const savePushSubscription = (subscription: PushSubscriptionInput) =>
  api<{ id: string }>('/push/subscriptions', { method: 'POST', body: subscription });

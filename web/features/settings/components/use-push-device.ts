import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { pushSubscriptionInput } from '@shared/schemas/notifications';
import { registerServiceWorker } from '../../../lib/service-worker';
import { deletePushSubscription } from '../api/delete-push-subscription';
import { getPushPublicKey } from '../api/get-push-public-key';
import { savePushSubscription } from '../api/save-push-subscription';
import {
  currentSubscription,
  pushAvailability,
  PushSetupError,
  subscribeThisDevice,
  type PushAvailability,
} from '../utils/web-push';

export interface PushDeviceState {
  availability: PushAvailability;
  permission: NotificationPermission | null;
  /** This browser's subscription endpoint, when it has one. */
  endpoint: string | null;
}

const deviceQueryKey = ['push', 'this-device'] as const;

async function readDevice(): Promise<PushDeviceState> {
  const availability = pushAvailability();
  if (availability !== 'available') return { availability, permission: null, endpoint: null };
  await registerServiceWorker();
  const subscription = await currentSubscription();
  return { availability, permission: Notification.permission, endpoint: subscription?.endpoint ?? null };
}

/** Whether this browser gets Brinewatch's notifications, and the two ways to change that. */
export function usePushDevice() {
  const queryClient = useQueryClient();
  const device = useQuery({
    queryKey: deviceQueryKey,
    queryFn: readDevice,
    staleTime: Infinity,
    retry: false,
  });
  const refresh = () => queryClient.invalidateQueries({ queryKey: deviceQueryKey });

  const turnOn = useMutation({
    mutationFn: async () => {
      const permission = await Notification.requestPermission();
      if (permission !== 'granted')
        throw new PushSetupError(permission === 'denied' ? 'blocked' : 'dismissed');
      // Asked afresh each time: a server that had no key yet may have one now.
      const { publicKey } = await getPushPublicKey();
      if (!publicKey) throw new PushSetupError('no-key');
      const subscription = await subscribeThisDevice(publicKey);
      const checked = pushSubscriptionInput.safeParse(subscription.toJSON());
      if (!checked.success) {
        await subscription.unsubscribe().catch(() => undefined);
        throw new PushSetupError('browser-refused');
      }
      try {
        await savePushSubscription(checked.data);
      } catch (error) {
        // A subscription the server does not know would look switched on and never ring.
        await subscription.unsubscribe().catch(() => undefined);
        throw error;
      }
    },
    onSettled: refresh,
  });

  const turnOff = useMutation({
    mutationFn: async () => {
      const subscription = await currentSubscription();
      if (!subscription) return;
      await deletePushSubscription(subscription.endpoint);
      await subscription.unsubscribe();
    },
    onSettled: refresh,
  });

  return { device, turnOn, turnOff };
}

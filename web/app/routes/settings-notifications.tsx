import { Page } from '../../components/page';
import { ErrorState, LoadingState } from '../../components/states';
import { useNotificationPreferences } from '../../features/settings/api/get-notification-preferences';
import { CalendarFeedCard } from '../../features/settings/components/calendar-feed-card';
import { NotificationPreferencesForm } from '../../features/settings/components/notification-preferences-form';
import { PushDeviceCard } from '../../features/settings/components/push-device-card';

export function NotificationSettingsRoute() {
  const preferences = useNotificationPreferences();
  return (
    <Page
      title="Notification settings"
      description="Choose how Brinewatch tells you when a reading crosses a limit."
    >
      <title>Notification settings — Brinewatch</title>
      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        {preferences.isPending ? (
          <LoadingState label="Loading your preferences…" />
        ) : preferences.isError ? (
          <ErrorState
            error={preferences.error}
            what="your notification preferences"
            onRetry={() => void preferences.refetch()}
          />
        ) : (
          <NotificationPreferencesForm initial={preferences.data} />
        )}
        <div className="grid min-w-0 gap-6">
          <PushDeviceCard />
          <CalendarFeedCard />
        </div>
      </div>
    </Page>
  );
}

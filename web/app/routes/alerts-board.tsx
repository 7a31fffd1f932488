import { Page } from '../../components/page';
import { AlertsBoard } from '../../features/alerts/components/alerts-board';
import { FailedDeliveries } from '../../features/alerts/components/failed-deliveries';
import { OnCallRoster } from '../../features/alerts/components/on-call-roster';
import { can, useMe } from '../../lib/auth';

export function ConsoleAlertsRoute() {
  const { data: me } = useMe();
  return (
    <Page title="Alerts" description="Every client tank’s alerts, the most serious and the oldest first.">
      <title>Alerts — Brinewatch</title>
      <div className="grid items-start gap-8 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <AlertsBoard />
        <div className="grid gap-6">
          <OnCallRoster canManage={can(me, 'on-call:manage')} />
          <FailedDeliveries />
        </div>
      </div>
    </Page>
  );
}

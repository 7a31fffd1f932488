import type { TankStatus } from '@shared/parameters/health';
import type { TankDetail } from '@shared/schemas/tanks';
import { TankStatusBadge } from '../../../components/status-badges';
import { statusReason } from '../utils/status-reason';
import { TankCover } from './tank-cover';

/** What the owner can do about each status; an alert's own first steps follow under Alerts. */
const nextStep: Readonly<Record<TankStatus, string>> = {
  alert:
    'Follow the first steps under the alert below. Your technician can see it too; this page updates by itself.',
  watch: 'Nothing urgent. Look at the readings below, and test again if one is drifting or out of date.',
  'no-data':
    'We have no current readings. Test the water and add a reading, or check that the probe is plugged in and online.',
  healthy: 'Nothing to do. Your technician keeps an eye on it between visits.',
};

const panelTone: Readonly<Record<TankStatus, string>> = {
  alert: 'border-alert-700 bg-alert-100',
  watch: 'border-watch-700 bg-watch-100',
  'no-data': 'border-nodata-700 bg-nodata-100',
  healthy: 'border-healthy-700 bg-healthy-100',
};

/** The first thing on a tank's page: how it is, why, and what to do next. */
export function TankAtAGlance({ tank }: { tank: TankDetail }) {
  const reason = statusReason(tank);
  return (
    <section
      aria-labelledby="glance-title"
      className={`flex gap-3 rounded-card border-l-8 p-4 shadow-card sm:gap-4 sm:p-5 ${panelTone[tank.status]}`}
    >
      <div className="min-w-0 flex-1">
        <h2 id="glance-title" className="sr-only">
          How the tank is
        </h2>
        <TankStatusBadge status={tank.status} size="lg" />
        {reason && <p className="mt-2 text-lg font-bold text-ink-950">{reason}</p>}
        <p className="mt-2 text-ink-900">
          <span className="font-bold">What to do next: </span>
          {nextStep[tank.status]}
        </p>
      </div>
      <div className="hidden h-24 w-32 shrink-0 overflow-hidden rounded-lg sm:block">
        <TankCover photo={tank.coverPhoto} />
      </div>
    </section>
  );
}

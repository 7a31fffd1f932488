import type { ReactNode } from 'react';
import { Link } from 'react-router';
import type { TankStatus } from '@shared/parameters/health';
import type { TankSummary } from '@shared/schemas/tanks';
import { TankStatusBadge } from '../../../components/status-badges';
import { formatDateTime, formatVisitWindow, relativeTime, useNow } from '../../../lib/format';
import { useLatestReadings } from '../../../lib/queries/latest-readings';
import { lastReadingAt, statusReason } from '../utils/status-reason';
import { TankCover } from './tank-cover';

/** A coloured edge beside the words, so a tank in trouble stands out in a list of calm ones. */
const statusEdge: Readonly<Record<TankStatus, string>> = {
  alert: 'border-l-alert-700',
  watch: 'border-l-watch-700',
  'no-data': 'border-l-nodata-700',
  healthy: 'border-l-healthy-700',
};

function LastReading({ tank, now }: { tank: TankSummary; now: number }) {
  const sent = lastReadingAt(tank);
  // Older answers do not carry the time of the last reading; the tank's latest readings do.
  const latest = useLatestReadings(tank.id, sent === undefined);
  const at = sent === undefined ? latest.data?.lastReadingAt : sent;
  if (at === undefined) return <span className="text-ink-600">Checking the last reading…</span>;
  if (at === null) return <>No readings yet</>;
  return (
    <>
      Last reading{' '}
      <time dateTime={at} title={formatDateTime(at)}>
        {relativeTime(at, now)}
      </time>
    </>
  );
}

/**
 * One tank on the owner's dashboard: status, why, and how fresh the news is come first; the
 * picture is a small reminder of which tank this is. The whole card opens the tank page.
 */
export function TankCard({ tank, footer }: { tank: TankSummary; footer?: ReactNode }) {
  const now = useNow();
  const reason = statusReason(tank);
  return (
    <article
      className={`relative flex h-full gap-3 overflow-hidden rounded-card border-l-8 bg-white p-3 shadow-card focus-within:outline-3 focus-within:outline-offset-2 focus-within:outline-brine-500 hover:shadow-lg sm:p-4 ${statusEdge[tank.status]}`}
    >
      <div className="h-20 w-20 shrink-0 overflow-hidden rounded-lg sm:h-24 sm:w-24">
        <TankCover photo={tank.coverPhoto} />
      </div>
      <div className="flex min-w-0 flex-1 flex-col gap-1.5">
        <h2 className="text-lg font-bold leading-snug text-ink-900">
          <Link
            to={`/tanks/${tank.id}`}
            className="text-ink-900 no-underline after:absolute after:inset-0 after:content-[''] focus:outline-none"
          >
            {tank.name}
          </Link>
        </h2>
        <div>
          <TankStatusBadge status={tank.status} />
        </div>
        {reason && <p className="text-ink-950">{reason}</p>}
        <p className="text-sm text-ink-700">
          <LastReading tank={tank} now={now} />
          {tank.siteLabel && <> · {tank.siteLabel}</>}
        </p>
        {tank.nextVisit && (
          <p className="text-sm text-ink-900">
            <span className="font-bold">Next visit:</span>{' '}
            <time dateTime={tank.nextVisit.windowStart}>
              {formatVisitWindow(
                tank.nextVisit.windowStart,
                tank.nextVisit.windowEnd,
                tank.nextVisit.timeZone,
              )}
            </time>
          </p>
        )}
        {footer}
      </div>
    </article>
  );
}

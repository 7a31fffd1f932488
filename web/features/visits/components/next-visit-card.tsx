import { Link } from 'react-router';
import type { VisitSummary } from '@shared/schemas/visits';
import { VisitKindBadge } from '../../../components/visit-badges';
import { formatVisitWindow } from '../../../lib/format';
import { useTankVisits } from '../api/get-tank-visits';

/** The next planned visit: when (at the tank's clock), what kind and who comes. */
export function NextVisitCard({
  next,
  isStaff,
}: {
  next: VisitSummary | null;
  /** Staff get a link to the visit's report screen and to the schedule. */
  isStaff: boolean;
}) {
  return (
    <section
      aria-labelledby="next-visit-title"
      className="rounded-card border-l-8 border-l-brine-700 bg-white p-4 shadow-card print:hidden"
    >
      <h3 id="next-visit-title" className="text-sm font-bold uppercase tracking-wide text-ink-700">
        Next visit
      </h3>
      {next ? (
        <>
          <p className="mt-1 text-xl font-bold text-ink-950">
            <time dateTime={next.windowStart}>
              {formatVisitWindow(next.windowStart, next.windowEnd, next.timeZone)}
            </time>
          </p>
          <div className="mt-2 flex flex-wrap items-center gap-2">
            <VisitKindBadge kind={next.kind} />
            <span className="text-ink-900">
              {next.technician ? `with ${next.technician.name}` : 'technician to be confirmed'}
            </span>
          </div>
          {isStaff && (
            <Link
              to={`/visits/${next.id}`}
              className="mt-2 inline-flex min-h-11 items-center font-bold text-brine-700"
            >
              {next.status === 'in-progress' ? 'Continue the report' : 'Start the report'}
            </Link>
          )}
        </>
      ) : (
        <p className="mt-1 text-ink-900">
          {isStaff ? (
            <>
              No visit planned.{' '}
              <Link
                to="/console/schedule"
                className="inline-flex min-h-11 items-center font-bold text-brine-700"
              >
                Plan one on the schedule
              </Link>
            </>
          ) : (
            'No visit planned yet. Your service company will let you know when it is.'
          )}
        </p>
      )}
    </section>
  );
}

/**
 * One line under the tank's name: "Next visit: Tue 8 Dec, 09:00–10:00", linking to the visits.
 * Nothing while loading or when none is planned: the visits section says so in words.
 */
export function NextVisitLine({ tankId, href }: { tankId: string; href: string }) {
  const visits = useTankVisits(tankId);
  const next = visits.data?.next;
  if (!next) return null;
  return (
    <p className="mb-3 text-ink-900 print:hidden">
      <span className="font-bold">Next visit:</span>{' '}
      <Link to={href} className="font-bold text-brine-700">
        <time dateTime={next.windowStart}>
          {formatVisitWindow(next.windowStart, next.windowEnd, next.timeZone)}
        </time>
      </Link>
      {next.technician && <span className="text-ink-700"> with {next.technician.name}</span>}
    </p>
  );
}

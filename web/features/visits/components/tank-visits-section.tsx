import { useEffect, useRef } from 'react';
import { Link } from 'react-router';
import type { CarriedItem, VisitSummary } from '@shared/schemas/visits';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { VisitKindBadge, VisitStatusBadge } from '../../../components/visit-badges';
import { can, useMe } from '../../../lib/auth';
import { formatDate, formatVisitWindow } from '../../../lib/format';
import { useTankVisits } from '../api/get-tank-visits';
import { useVisit } from '../api/get-visit';
import { DraftInvoiceButton } from '../../../components/draft-invoice-button';
import { NextVisitCard } from './next-visit-card';
import { ReportView } from './report-view';

interface TankFacts {
  id: string;
  name: string;
  siteLabel: string | null;
  companyName: string;
}

const linkClass = 'inline-flex min-h-11 items-center font-bold text-brine-700';

/** The report chosen (a notification's link, or a tap in the list), or the newest one. */
function ShownReport({ visitId, tank, focused }: { visitId: string; tank: TankFacts; focused: boolean }) {
  const visit = useVisit(visitId);
  const { data: me } = useMe();
  const ref = useRef<HTMLDivElement>(null);
  const loaded = visit.isSuccess;
  // A link to one report lands on it, below the next visit.
  useEffect(() => {
    if (focused && loaded) ref.current?.scrollIntoView({ block: 'start' });
  }, [focused, loaded, visitId]);

  if (visit.isPending) return <LoadingState label="Loading the visit report…" />;
  if (visit.isError) {
    return <ErrorState error={visit.error} what="this visit report" onRetry={() => void visit.refetch()} />;
  }
  if (!visit.data.published || visit.data.tankId !== tank.id) {
    return (
      <EmptyState title="This visit has no published report yet">
        <Link to={`/visits/${visitId}`} className={linkClass}>
          Open the visit
        </Link>
      </EmptyState>
    );
  }
  return (
    <div ref={ref} className="grid scroll-mt-4 gap-3">
      <ReportView
        visit={visit.data}
        tankName={tank.name}
        siteLabel={tank.siteLabel}
        companyName={tank.companyName}
      />
      {can(me, 'invoices:manage') && <DraftInvoiceButton source={{ visitId: visit.data.id }} />}
    </div>
  );
}

/** Staff: what is planned or being written, and what earlier visits left to do. */
function StaffPlan({ planned, items }: { planned: VisitSummary[]; items: CarriedItem[] }) {
  return (
    <div className="grid gap-4 print:hidden md:grid-cols-2">
      <section aria-labelledby="planned-visits-title" className="rounded-card bg-white p-4 shadow-card">
        <h3 id="planned-visits-title" className="text-lg font-bold text-ink-900">
          Planned and in progress
        </h3>
        {planned.length === 0 ? (
          <p className="mt-1 text-ink-700">Nothing planned in the next two months.</p>
        ) : (
          <ul className="mt-2 divide-y divide-ink-100">
            {planned.map((visit) => (
              <li key={visit.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <div className="min-w-0">
                  <p className="font-bold text-ink-950">
                    {formatVisitWindow(visit.windowStart, visit.windowEnd, visit.timeZone)}
                  </p>
                  <div className="mt-1 flex flex-wrap gap-2">
                    <VisitKindBadge kind={visit.kind} size="sm" />
                    <VisitStatusBadge status={visit.status} size="sm" />
                  </div>
                  <p className="mt-1 text-sm text-ink-700">
                    {visit.technician?.name ?? 'Nobody assigned yet'}
                  </p>
                </div>
                <Link to={`/visits/${visit.id}`} className={linkClass}>
                  {visit.status === 'in-progress' ? 'Continue report' : 'Start report'}
                  <span className="sr-only">
                    {' '}
                    for {formatVisitWindow(visit.windowStart, visit.windowEnd, visit.timeZone)}
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        )}
      </section>
      <section aria-labelledby="open-items-title" className="rounded-card bg-white p-4 shadow-card">
        <h3 id="open-items-title" className="text-lg font-bold text-ink-900">
          Carried to the next visit
        </h3>
        {items.length === 0 ? (
          <p className="mt-1 text-ink-700">Nothing left open by earlier visits.</p>
        ) : (
          <ul className="mt-2 grid gap-2">
            {items.map((item) => (
              <li key={item.id} className="flex gap-2">
                <span
                  aria-hidden="true"
                  className="mt-1.5 h-3 w-3 shrink-0 rounded-sm border-2 border-ink-700"
                />
                <span>
                  {item.text}
                  <span className="block text-sm text-ink-700">since {formatDate(item.openedAt)}</span>
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}

/**
 * A tank's visits: the next one, the chosen (or newest) published report in full, and every
 * earlier report one tap away. Staff also see what is planned and the items carried forward.
 */
export function TankVisitsSection({
  tank,
  isStaff,
  visitId,
  hrefFor,
}: {
  tank: TankFacts;
  isStaff: boolean;
  /** A report asked for in the address (`&visit=`), as notifications link to it. */
  visitId: string | null;
  /** The address of this section showing one report. */
  hrefFor: (visitId: string) => string;
}) {
  const visits = useTankVisits(tank.id);

  if (visits.isPending) return <LoadingState label="Loading visits…" />;
  if (visits.isError) {
    return <ErrorState error={visits.error} what="the visits" onRetry={() => void visits.refetch()} />;
  }
  const reports = visits.data.visits.filter((visit) => visit.status === 'published');
  const planned = visits.data.visits
    .filter((visit) => visit.status === 'scheduled' || visit.status === 'in-progress')
    .sort((a, b) => Date.parse(a.windowStart) - Date.parse(b.windowStart));
  const shownId = visitId ?? reports[0]?.id ?? null;

  return (
    <div className="grid max-w-3xl gap-6">
      <NextVisitCard next={visits.data.next} isStaff={isStaff} />
      {isStaff && <StaffPlan planned={planned} items={visits.data.openItems} />}
      {shownId ? (
        <ShownReport key={shownId} visitId={shownId} tank={tank} focused={visitId !== null} />
      ) : (
        <EmptyState title="No visit reports yet">
          After each visit the technician’s report appears here: what was done, the readings taken and the
          photos.
        </EmptyState>
      )}
      {reports.length > 1 && (
        <section aria-labelledby="earlier-reports-title" className="print:hidden">
          <h3 id="earlier-reports-title" className="text-lg font-bold text-ink-900">
            All reports
          </h3>
          <ul className="mt-2 divide-y divide-ink-100 rounded-card bg-white shadow-card">
            {reports.map((report) => {
              const current = report.id === shownId;
              return (
                <li key={report.id}>
                  <Link
                    to={hrefFor(report.id)}
                    preventScrollReset
                    aria-current={current ? 'true' : undefined}
                    className={`flex min-h-12 flex-wrap items-center justify-between gap-2 px-4 py-2 no-underline hover:bg-ink-50 ${
                      current ? 'bg-brine-100' : ''
                    }`}
                  >
                    <span className="font-bold text-brine-700">
                      {formatDate(report.windowStart, report.timeZone)}
                      <span className="font-normal text-ink-700">
                        {' '}
                        · {report.technician?.name ?? 'Technician'}
                      </span>
                    </span>
                    <span className="flex items-center gap-2">
                      <VisitKindBadge kind={report.kind} size="sm" />
                      {current && <span className="text-sm font-bold text-ink-900">Shown above</span>}
                      {report.editedAt && <span className="text-sm text-ink-700">edited</span>}
                    </span>
                  </Link>
                </li>
              );
            })}
          </ul>
        </section>
      )}
    </div>
  );
}

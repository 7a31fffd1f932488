import { useState } from 'react';
import { Link } from 'react-router';
import type { VisitStatus, VisitSummary } from '@shared/schemas/visits';
import { Button } from '../../../components/button';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { FieldError } from '../../../components/field-error';
import { VisitKindBadge, VisitStatusBadge } from '../../../components/visit-badges';
import { formatTime, formatTimeWindow, formatVisitWindow } from '../../../lib/format';
import { problemMessage } from '../../../lib/problem-message';
import { useUpdateVisit } from '../api/update-visit';
import { ReassignDialog } from './reassign-dialog';

/** A coloured edge beside the words, so the day's open work stands out from what is done. */
const statusEdge: Readonly<Record<VisitStatus, string>> = {
  scheduled: 'border-l-brine-700',
  'in-progress': 'border-l-watch-700',
  published: 'border-l-healthy-700',
  cancelled: 'border-l-nodata-700',
};

/**
 * What tapping the card does next, in the words of the report screen it opens. The status badge
 * already says "Report published" or "Cancelled", so those cards do not say it twice.
 */
const nextStep: Readonly<Record<VisitStatus, { label: string; look: string } | null>> = {
  scheduled: { label: 'Start report', look: 'bg-brine-700 text-white' },
  'in-progress': { label: 'Continue report', look: 'bg-watch-700 text-white' },
  published: {
    label: 'Read the report',
    look: 'border-2 border-healthy-700/40 bg-healthy-100 text-healthy-700',
  },
  cancelled: null,
};

/** The tank's wall clock is the one that counts; it is named only when it differs from this device's. */
function ZoneNote({ visit }: { visit: VisitSummary }) {
  if (formatTime(visit.windowStart, visit.timeZone) === formatTime(visit.windowStart)) return null;
  return <span className="block text-sm font-normal text-ink-700">at the tank ({visit.timeZone})</span>;
}

/**
 * One visit in a day's list: a large card that opens the visit's report screen wherever it is
 * tapped. Admins get their controls below it, above the card's link, and their dialogs beside it.
 */
export function VisitCard({
  visit,
  showTechnician,
  canManage,
}: {
  visit: VisitSummary;
  /** On everyone's schedule, say whose visit it is. */
  showTechnician: boolean;
  /** Reassign, cancel and restore (admins). */
  canManage: boolean;
}) {
  const [dialog, setDialog] = useState<'reassign' | 'cancel' | null>(null);
  const update = useUpdateVisit(visit.id);
  const cancelled = visit.status === 'cancelled';
  const step = nextStep[visit.status];
  const titleId = `visit-${visit.id}-title`;
  const closeDialog = () => {
    setDialog(null);
    update.reset();
  };

  return (
    <>
      <article
        aria-labelledby={titleId}
        className={`relative rounded-card border-l-8 bg-white p-4 shadow-card focus-within:outline-3 focus-within:outline-offset-2 focus-within:outline-brine-500 hover:shadow-lg ${statusEdge[visit.status]} ${cancelled ? 'bg-ink-50' : ''}`}
      >
        <div className="flex flex-wrap items-start justify-between gap-2">
          <p
            className={`text-xl font-bold tabular-nums ${cancelled ? 'text-ink-700 line-through' : 'text-ink-950'}`}
          >
            <time dateTime={visit.windowStart}>
              {formatTimeWindow(visit.windowStart, visit.windowEnd, visit.timeZone)}
            </time>
            <ZoneNote visit={visit} />
          </p>
          <VisitStatusBadge status={visit.status} />
        </div>
        <h3 id={titleId} className="mt-1 text-lg font-bold leading-snug">
          <Link
            to={`/visits/${visit.id}`}
            className="text-ink-900 no-underline after:absolute after:inset-0 after:rounded-card after:content-[''] focus:outline-none"
          >
            {visit.tankName}
          </Link>
        </h3>
        {visit.siteLabel && <p className="text-ink-700">{visit.siteLabel}</p>}
        <div className="mt-2 flex flex-wrap items-center gap-2">
          <VisitKindBadge kind={visit.kind} />
          {visit.repeats && <span className="text-sm text-ink-700">Repeats at the service interval</span>}
        </div>
        {showTechnician && (
          <p className="mt-2 text-sm">
            <span className="font-bold text-ink-700">Technician: </span>
            <span className="text-ink-950">{visit.technician?.name ?? 'Nobody yet'}</span>
          </p>
        )}
        {visit.note && <p className="mt-2 whitespace-pre-line text-sm text-ink-900">{visit.note}</p>}
        {step && (
          <p className="mt-3">
            <span
              className={`inline-flex min-h-11 items-center gap-2 rounded-lg px-4 font-bold ${step.look}`}
            >
              {step.label}
              <span aria-hidden="true">→</span>
            </span>
          </p>
        )}

        {canManage && visit.status !== 'published' && (
          // Above the card's link, so these buttons take their own taps.
          <div className="relative z-10 mt-3 flex flex-wrap gap-2 border-t border-ink-100 pt-3">
            {!cancelled && (
              <Button tone="secondary" onClick={() => setDialog('reassign')}>
                Reassign<span className="sr-only"> {visit.tankName}</span>
              </Button>
            )}
            {cancelled ? (
              <Button
                tone="secondary"
                disabled={update.isPending}
                onClick={() => update.mutate({ cancelled: false })}
              >
                {update.isPending ? 'Restoring…' : 'Restore visit'}
              </Button>
            ) : (
              <Button tone="secondary" onClick={() => setDialog('cancel')}>
                Cancel visit<span className="sr-only"> to {visit.tankName}</span>
              </Button>
            )}
            {cancelled && update.isError && (
              <div role="alert" className="w-full">
                <FieldError className="mt-0">{problemMessage(update.error)}</FieldError>
              </div>
            )}
          </div>
        )}
      </article>
      {canManage && (
        <>
          {dialog === 'reassign' && <ReassignDialog visit={visit} onClose={() => setDialog(null)} />}
          <ConfirmDialog
            open={dialog === 'cancel'}
            title="Cancel this visit?"
            confirmLabel="Cancel visit"
            cancelLabel="Keep the visit"
            pendingLabel="Cancelling…"
            pending={update.isPending}
            error={update.isError ? problemMessage(update.error) : undefined}
            onConfirm={() => update.mutate({ cancelled: true }, { onSuccess: closeDialog })}
            onClose={closeDialog}
          >
            <p>
              {visit.tankName}, {formatVisitWindow(visit.windowStart, visit.windowEnd, visit.timeZone)}.
            </p>
            <p>It stays on the schedule as cancelled, and you can restore it later.</p>
          </ConfirmDialog>
        </>
      )}
    </>
  );
}

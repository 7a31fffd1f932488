import { useEffect, useRef } from 'react';
import { Link } from 'react-router';
import { AlertStatusBadge, SeverityBadge } from '../../../components/alert-badges';
import { ErrorState, LoadingState } from '../../../components/states';
import { useNow } from '../../../lib/format';
import { useAlert } from '../api/get-alert';
import { criticalFirstSteps } from '../utils/alert-facts';
import { AlertActions } from './alert-actions';
import { AlertFactsList } from './alert-facts-list';
import { AlertTimeline } from './alert-timeline';
import { FirstStepsPanel } from './first-steps-panel';

const titleId = 'alert-drawer-title';

function DrawerBody({ alertId, onDone }: { alertId: string; onDone: (message: string) => void }) {
  const alert = useAlert(alertId);
  const now = useNow();
  if (alert.isPending) return <LoadingState label="Loading the alert…" />;
  if (alert.isError) {
    return <ErrorState error={alert.error} what="this alert" onRetry={() => void alert.refetch()} />;
  }
  const view = alert.data;
  const steps = criticalFirstSteps(view);
  return (
    <div className="space-y-6">
      <div>
        <div className="flex flex-wrap items-center gap-2">
          <SeverityBadge severity={view.severity} />
          <AlertStatusBadge status={view.status} />
        </div>
        <p className="mt-3 text-lg font-bold text-ink-900">{view.title}</p>
        <p className="text-sm text-ink-700">
          <Link to={`/tanks/${view.tank.id}`} className="font-bold text-brine-700">
            {view.tank.name}
          </Link>
          {view.tank.siteLabel && <> · {view.tank.siteLabel}</>}
        </p>
        <p className="mt-2 text-ink-900">{view.body}</p>
        <AlertFactsList alert={view} now={now} />
        {steps && <FirstStepsPanel steps={steps} />}
      </div>
      {view.status !== 'resolved' && <AlertActions alert={view} onDone={onDone} />}
      <section aria-labelledby="alert-timeline-title">
        <h3 id="alert-timeline-title" className="mb-3 text-lg font-bold text-ink-900">
          Timeline
        </h3>
        <AlertTimeline alert={view} now={now} />
      </section>
    </div>
  );
}

/**
 * The alert's detail beside the board: a modal side panel (full screen on a phone). The native
 * dialog keeps focus inside, closes on Escape and hands focus back to the button that opened it.
 */
export function AlertDrawer({
  alertId,
  onClose,
  onDone,
}: {
  alertId: string | null;
  onClose: () => void;
  onDone: (message: string) => void;
}) {
  const dialogRef = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const dialog = dialogRef.current;
    if (!dialog) return;
    if (alertId && !dialog.open) dialog.showModal();
    else if (!alertId && dialog.open) dialog.close();
  }, [alertId]);

  return (
    <dialog
      ref={dialogRef}
      aria-labelledby={titleId}
      onClose={onClose}
      className="fixed inset-0 m-0 ml-auto h-dvh max-h-dvh w-full max-w-full overflow-y-auto bg-sand-50 p-0 text-ink-950 shadow-card backdrop:bg-ink-950/60 sm:max-w-xl"
    >
      <div className="sticky top-0 z-10 flex items-center justify-between gap-3 border-b border-ink-100 bg-white px-4 py-3 sm:px-6">
        <h2 id={titleId} className="text-xl font-bold text-ink-900">
          Alert details
        </h2>
        <button
          type="button"
          onClick={() => dialogRef.current?.close()}
          className="inline-flex min-h-11 min-w-11 items-center justify-center rounded-lg border border-ink-300 bg-white px-3 font-bold text-ink-900 hover:bg-ink-50"
        >
          Close<span className="sr-only"> alert details</span>
        </button>
      </div>
      <div className="px-4 py-5 sm:px-6">{alertId && <DrawerBody alertId={alertId} onDone={onDone} />}</div>
    </dialog>
  );
}

import { useState } from 'react';
import { Link } from 'react-router';
import { Button } from '../../../components/button';
import { TankChoiceSheet } from '../../../components/tank-choice-sheet';
import { useOpenTankUrgentRequest } from '../api/list-urgent-requests';
import { UrgentStatusBadge } from './urgent-status-badge';

/** The one look of "ask for help now": strong, with a shape as well as colour. */
export const urgentActionClass =
  'inline-flex min-h-12 items-center justify-center gap-2 rounded-lg bg-alert-700 px-4 py-2 font-bold text-white no-underline hover:opacity-90';

function UrgentMark() {
  return (
    <svg viewBox="0 0 16 16" className="h-5 w-5 shrink-0" aria-hidden="true" focusable="false">
      <circle cx="8" cy="8" r="7" fill="none" stroke="currentColor" strokeWidth="2" />
      <rect x="7" y="3.6" width="2" height="5.6" rx="1" fill="currentColor" />
      <circle cx="8" cy="11.7" r="1.2" fill="currentColor" />
    </svg>
  );
}

/**
 * On the owner's dashboard: one tap to the form when they have one tank; otherwise the same tap
 * asks which tank, each a large target.
 */
export function RequestUrgentVisitAction({ tanks }: { tanks: readonly { id: string; name: string }[] }) {
  const [asking, setAsking] = useState(false);
  if (tanks.length === 0) return null;
  if (tanks.length === 1)
    return (
      <Link to={`/tanks/${tanks[0]!.id}/urgent`} className={urgentActionClass}>
        <UrgentMark />
        Request an urgent visit
      </Link>
    );
  return (
    <>
      <Button tone="danger" className="min-h-12" onClick={() => setAsking(true)}>
        <UrgentMark />
        Request an urgent visit
      </Button>
      {asking && (
        <TankChoiceSheet
          title="Which tank needs help?"
          tanks={tanks}
          hrefOf={(tank) => `/tanks/${tank.id}/urgent`}
          onClose={() => setAsking(false)}
        />
      )}
    </>
  );
}

/**
 * On a tank's page: the request form, or — while a request for this tank is still open — the way
 * to follow it, with the form still one tap away for something new.
 */
export function TankUrgentVisitAction({ tankId }: { tankId: string }) {
  const open = useOpenTankUrgentRequest(tankId);
  if (open)
    return (
      <>
        <Link
          to={`/urgent/${open.id}`}
          className="inline-flex min-h-12 items-center gap-2 rounded-lg border-2 border-alert-700 bg-white px-4 font-bold text-alert-700 no-underline hover:bg-alert-100"
        >
          Urgent request
          <UrgentStatusBadge status={open.status} size="sm" />
        </Link>
        <Link to={`/tanks/${tankId}/urgent`} className={urgentActionClass}>
          <UrgentMark />
          Request an urgent visit
        </Link>
      </>
    );
  return (
    <Link to={`/tanks/${tankId}/urgent`} className={urgentActionClass}>
      <UrgentMark />
      Request an urgent visit
    </Link>
  );
}

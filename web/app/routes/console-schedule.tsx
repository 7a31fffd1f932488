import { useCallback, useState } from 'react';
import { useSearchParams } from 'react-router';
import type { VisitSummary } from '@shared/schemas/visits';
import { Button } from '../../components/button';
import { Page } from '../../components/page';
import { PlanVisitForm } from '../../features/schedule/components/plan-visit-form';
import { ScheduleBoard } from '../../features/schedule/components/schedule-board';
import { WhoFilter } from '../../features/schedule/components/who-filter';
import {
  scheduleSearch,
  scheduleStateFrom,
  type ScheduleState,
} from '../../features/schedule/utils/schedule-state';
import { can, useMe } from '../../lib/auth';
import { dayIn, formatVisitWindow, useNow } from '../../lib/format';

/**
 * The visits to make: a technician's day or week on their phone, and for admins anyone's, with
 * reassigning and cancelling. What is shown lives in the address (`?view=&day=&who=`).
 */
export function ConsoleScheduleRoute() {
  const [params, setParams] = useSearchParams();
  const { data: me } = useMe();
  const seesEveryone = can(me, 'visits:assign');
  // A screen left open past midnight moves "today" with the clock.
  const today = dayIn(useNow(60_000));
  const state = scheduleStateFrom(params, { today, seesEveryone });
  const [planning, setPlanning] = useState(false);
  const [planned, setPlanned] = useState<VisitSummary | null>(null);

  const hrefFor = (change: Partial<ScheduleState>) => scheduleSearch({ ...state, ...change });
  const { view, day, who } = state;
  const go = useCallback(
    (change: Partial<ScheduleState>) =>
      setParams(new URLSearchParams(scheduleSearch({ view, day, who, ...change }))),
    [setParams, view, day, who],
  );

  const title = who === 'me' ? (view === 'day' ? 'My day' : 'My week') : 'Schedule';
  return (
    <Page
      title={title}
      description={
        who === 'me'
          ? 'Your visits, at the time on the clock where each tank is. Open a visit for its report.'
          : who === 'everyone'
            ? 'Everyone’s visits. Open a visit for its report.'
            : 'One technician’s visits. Open a visit for its report.'
      }
      actions={
        me && !planning ? (
          <Button
            onClick={() => {
              setPlanning(true);
              setPlanned(null);
            }}
          >
            Plan a visit
          </Button>
        ) : undefined
      }
    >
      {planning && me && (
        <section
          aria-labelledby="plan-visit-title"
          className="mb-5 rounded-card bg-white p-4 shadow-card sm:p-6"
        >
          <h2 id="plan-visit-title" className="mb-3 text-xl font-bold text-ink-900">
            Plan a visit
          </h2>
          <PlanVisitForm
            day={day}
            me={me}
            canAssign={seesEveryone}
            onCancel={() => setPlanning(false)}
            onPlanned={(visit) => {
              setPlanning(false);
              setPlanned(visit);
              // Show the day the visit went to, so it can be seen in its place.
              go({ day: dayIn(visit.windowStart) });
            }}
          />
        </section>
      )}
      {/* Outside the grid below, so the empty live region takes no room. */}
      <div role="status">
        {planned && (
          <p className="mb-5 rounded-card border border-healthy-700/30 bg-healthy-100 p-4 font-bold text-healthy-700">
            Planned: {planned.tankName},{' '}
            {formatVisitWindow(planned.windowStart, planned.windowEnd, planned.timeZone)}
            {planned.repeats ? ', repeating at its service interval' : ''}.
          </p>
        )}
      </div>
      <div className="grid gap-5">
        {seesEveryone && <WhoFilter who={who} hrefFor={hrefFor} onChange={(next) => go({ who: next })} />}
        <ScheduleBoard
          state={state}
          today={today}
          canManage={seesEveryone}
          hrefFor={hrefFor}
          onViewChange={(next) => go({ view: next })}
        />
      </div>
    </Page>
  );
}

import { Link } from 'react-router';
import type { ScheduleQuery, VisitSummary } from '@shared/schemas/visits';
import { Badge } from '../../../components/badge';
import { RadioGroup } from '../../../components/radio-group';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { dayIn, formatWeekday, formatWeekdayLong } from '../../../lib/format';
import { useSchedule } from '../api/list-schedule';
import { addDays, floatingDay, weekOf } from '../utils/days';
import type { ScheduleState, ScheduleView } from '../utils/schedule-state';
import { VisitCard } from './visit-card';

const stepLook =
  'inline-flex min-h-11 min-w-11 items-center justify-center rounded-lg border-2 px-3 font-bold no-underline';
const stepClass = `${stepLook} border-ink-300 bg-white text-ink-900 hover:border-ink-700`;
/** "Today" while today is on screen: filled, like the chosen view. */
const currentStepClass = `${stepLook} border-ink-800 bg-ink-800 text-white`;

/** "Tuesday 8 December", with the year only when it is not this year's. */
const dayName = (day: string, today: string) =>
  `${formatWeekdayLong(floatingDay(day), 'UTC')}${day.slice(0, 4) === today.slice(0, 4) ? '' : ` ${day.slice(0, 4)}`}`;
const shortDayName = (day: string) => formatWeekday(floatingDay(day), 'UTC');
const countOf = (count: number) => `${count} ${count === 1 ? 'visit' : 'visits'}`;

function TodayBadge() {
  return (
    <Badge tone="bg-brine-700 text-white" size="sm">
      Today
    </Badge>
  );
}

/** Day or week, and a step back, to today and forward; every step is its own address. */
function ScheduleControls({
  state,
  today,
  days,
  hrefFor,
  onViewChange,
}: {
  state: ScheduleState;
  today: string;
  days: string[];
  hrefFor: (change: Partial<ScheduleState>) => string;
  onViewChange: (view: ScheduleView) => void;
}) {
  const step = state.view === 'day' ? 1 : 7;
  const unit = state.view === 'day' ? 'day' : 'week';
  const showsToday = days.includes(today);
  return (
    <div className="flex flex-wrap items-end justify-between gap-3">
      <RadioGroup<ScheduleView>
        legend="Show"
        hideLegend
        look="compact"
        value={state.view}
        onChange={onViewChange}
        options={[
          { value: 'day', label: 'Day' },
          { value: 'week', label: 'Week' },
        ]}
      />
      <nav aria-label={`Move through the ${unit}s`}>
        <ul className="flex gap-1">
          <li>
            <Link to={hrefFor({ day: addDays(state.day, -step) })} className={stepClass}>
              <span aria-hidden="true">‹&nbsp;</span>Previous<span className="sr-only"> {unit}</span>
            </Link>
          </li>
          <li>
            <Link
              to={hrefFor({ day: today })}
              className={showsToday ? currentStepClass : stepClass}
              aria-current={showsToday ? 'date' : undefined}
            >
              Today
            </Link>
          </li>
          <li>
            <Link to={hrefFor({ day: addDays(state.day, step) })} className={stepClass}>
              Next<span className="sr-only"> {unit}</span>
              <span aria-hidden="true">&nbsp;›</span>
            </Link>
          </li>
        </ul>
      </nav>
    </div>
  );
}

function VisitList({
  visits,
  showTechnician,
  canManage,
  label,
}: {
  visits: VisitSummary[];
  showTechnician: boolean;
  canManage: boolean;
  label: string;
}) {
  return (
    <ul aria-label={label} className="grid items-start gap-3 lg:grid-cols-2">
      {visits.map((visit) => (
        <li key={visit.id}>
          <VisitCard visit={visit} showTechnician={showTechnician} canManage={canManage} />
        </li>
      ))}
    </ul>
  );
}

/**
 * A technician's day or week, or (for admins) anyone's: visits grouped by the day they fall on in
 * this device's zone, each shown at the wall times of its tank, today marked.
 */
export function ScheduleBoard({
  state,
  today,
  canManage,
  hrefFor,
  onViewChange,
}: {
  state: ScheduleState;
  today: string;
  canManage: boolean;
  hrefFor: (change: Partial<ScheduleState>) => string;
  onViewChange: (view: ScheduleView) => void;
}) {
  const days = state.view === 'day' ? [state.day] : weekOf(state.day);
  const first = days[0]!;
  const last = days[days.length - 1]!;
  // The API reads days in the zone saved for the person, this screen in the device's; a day more on
  // each side covers any difference between the two, and the grouping below keeps only these days.
  const query: ScheduleQuery = {
    from: addDays(first, -1),
    to: addDays(last, 1),
    technicianId: state.who === 'everyone' ? undefined : state.who,
  };
  const schedule = useSchedule(query);
  const byDay = new Map<string, VisitSummary[]>(days.map((day) => [day, []]));
  for (const visit of schedule.data ?? []) byDay.get(dayIn(visit.windowStart))?.push(visit);
  const total = [...byDay.values()].reduce((sum, list) => sum + list.length, 0);
  const showTechnician = state.who !== 'me';

  return (
    <div className="grid gap-4">
      <ScheduleControls
        state={state}
        today={today}
        days={days}
        hrefFor={hrefFor}
        onViewChange={onViewChange}
      />
      {state.view === 'week' && (
        <p className="font-bold text-ink-900">
          {shortDayName(first)} – {shortDayName(last)}
          {schedule.isSuccess && <span className="font-normal text-ink-700"> · {countOf(total)}</span>}
        </p>
      )}
      <div aria-live="polite" className="grid gap-6">
        {schedule.isPending ? (
          <LoadingState label="Loading the schedule…" />
        ) : schedule.isError ? (
          <ErrorState error={schedule.error} what="the schedule" onRetry={() => void schedule.refetch()} />
        ) : state.view === 'day' ? (
          <section aria-labelledby="schedule-day-title" className="grid gap-3">
            <h2
              id="schedule-day-title"
              className="flex flex-wrap items-center gap-2 text-xl font-bold text-ink-900"
            >
              {dayName(state.day, today)}
              {state.day === today && <TodayBadge />}
              <span className="text-base font-normal text-ink-700">{countOf(total)}</span>
            </h2>
            {total === 0 ? (
              <EmptyState
                title={state.day === today ? 'No visits today' : `No visits on ${shortDayName(state.day)}`}
              >
                {showTechnician ? 'Nobody has a visit planned on this day.' : 'Plan one with “Plan a visit”.'}
              </EmptyState>
            ) : (
              <VisitList
                visits={byDay.get(state.day) ?? []}
                showTechnician={showTechnician}
                canManage={canManage}
                label={`Visits on ${dayName(state.day, today)}`}
              />
            )}
          </section>
        ) : total === 0 ? (
          <EmptyState title="No visits this week">
            {showTechnician ? 'Nobody has a visit planned this week.' : 'Plan one with “Plan a visit”.'}
          </EmptyState>
        ) : (
          days.map((day) => {
            const visits = byDay.get(day) ?? [];
            const isToday = day === today;
            return (
              <section
                key={day}
                aria-labelledby={`schedule-${day}`}
                className={`grid gap-3 ${isToday ? '-mx-2 rounded-card bg-brine-100 p-2 sm:-mx-3 sm:p-3' : ''}`}
              >
                <h2
                  id={`schedule-${day}`}
                  className="flex flex-wrap items-center gap-2 text-lg font-bold text-ink-900"
                >
                  {dayName(day, today)}
                  {isToday && <TodayBadge />}
                  <span className="text-base font-normal text-ink-700">
                    {visits.length === 0 ? 'no visits' : countOf(visits.length)}
                  </span>
                </h2>
                {visits.length > 0 && (
                  <VisitList
                    visits={visits}
                    showTechnician={showTechnician}
                    canManage={canManage}
                    label={`Visits on ${dayName(day, today)}`}
                  />
                )}
              </section>
            );
          })
        )}
      </div>
    </div>
  );
}

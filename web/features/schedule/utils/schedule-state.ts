import { z } from 'zod';
import { isCalendarDay } from './days';

export type ScheduleView = 'day' | 'week';
/** Whose visits: the signed-in person's, everyone's, or one member of staff's (by id). */
export type ScheduleWho = 'me' | 'everyone' | (string & {});

/** What the schedule shows, kept in the address so a reload, a shared link and the back button agree. */
export interface ScheduleState {
  view: ScheduleView;
  day: string;
  who: ScheduleWho;
}

const staffId = z.uuid();

/**
 * Reads `?view=week&day=2026-12-08&who=everyone`. Left out, it is today's day; whoever may see
 * everyone's schedule opens on everyone's, a technician always sees their own.
 */
export function scheduleStateFrom(
  params: URLSearchParams,
  { today, seesEveryone }: { today: string; seesEveryone: boolean },
): ScheduleState {
  const day = params.get('day');
  const who = params.get('who');
  return {
    view: params.get('view') === 'week' ? 'week' : 'day',
    day: isCalendarDay(day) ? day : today,
    who: !seesEveryone
      ? 'me'
      : who === 'me' || who === 'everyone' || staffId.safeParse(who).success
        ? (who as ScheduleWho)
        : 'everyone',
  };
}

/** The address of a state: "?view=week&day=2026-12-08&who=everyone". */
export function scheduleSearch(state: ScheduleState): string {
  return `?${new URLSearchParams({ view: state.view, day: state.day, who: state.who })}`;
}

import type { AppDeps } from '../deps';
import type { AppEvent } from '../lib/event-bus';
import type { Actor } from './actors';

/** What a screen needs to know to refetch: which tank, alert, conversation or urgent request changed. */
export type LiveEventData = Pick<AppEvent, 'tankId' | 'alertId' | 'conversationId' | 'requestId'>;

/**
 * Every alert, notification, conversation or urgent-request event (from any API process, through LISTEN/NOTIFY) addressed to
 * this person, as a small "refetch this" message. Returns how to stop listening, or null where
 * this process has no listener (API-only tests).
 */
export function subscribeToEvents(
  deps: Pick<AppDeps, 'events'>,
  actor: Actor,
  onEvent: (type: AppEvent['type'], data: LiveEventData) => void,
): (() => void) | null {
  if (!deps.events) return null;
  return deps.events.on((event) => {
    if (!event.userIds.includes(actor.id)) return;
    onEvent(event.type, {
      tankId: event.tankId,
      alertId: event.alertId,
      conversationId: event.conversationId,
      requestId: event.requestId,
    });
  });
}

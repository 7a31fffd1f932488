import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { useMe } from '../../lib/auth';
import { alertKeys, conversationKeys, notificationKeys, tankKeys, urgentKeys } from '../../lib/query-keys';

export type LiveEventType = 'alert' | 'notification' | 'conversation' | 'urgent';

/** What the server says changed; the client refetches rather than trusting a payload. */
export interface LiveEventData {
  type?: LiveEventType;
  tankId?: string;
  alertId?: string;
  conversationId?: string;
  requestId?: string;
}

const streamUrl = '/api/events';
/** After the stream gives up for good (a refused or failed connection), try again this much later. */
const reopenAfterMs = 30_000;

/**
 * Marks stale what an event touches. A message refreshes the conversations (threads, inbox, unread
 * counts) and the notification inbox; an urgent request's change, the requests and the tank's page
 * (its timeline); anything else (an alert, a notification, a reconnect) everything below.
 */
export function refreshAfterLiveEvent(queryClient: QueryClient, data: LiveEventData = {}) {
  if (data.type === 'conversation') {
    void queryClient.invalidateQueries({ queryKey: conversationKeys.all });
    void queryClient.invalidateQueries({ queryKey: notificationKeys.inbox });
    return;
  }
  if (data.type === 'urgent') {
    void queryClient.invalidateQueries({ queryKey: urgentKeys.all });
    void queryClient.invalidateQueries({ queryKey: notificationKeys.inbox });
    if (data.tankId) void queryClient.invalidateQueries({ queryKey: tankKeys.detail(data.tankId) });
    return;
  }
  void queryClient.invalidateQueries({ queryKey: conversationKeys.all });
  void queryClient.invalidateQueries({ queryKey: urgentKeys.all });
  void queryClient.invalidateQueries({ queryKey: alertKeys.all });
  void queryClient.invalidateQueries({ queryKey: notificationKeys.inbox });
  // An alert changes with the readings behind it, and tank lists and pages show both. Alert
  // events are rare (a limit crossed, an alert picked up or closed), and only queries on screen
  // refetch, so every tank query is marked stale rather than guessing which ones show this tank.
  void queryClient.invalidateQueries({ queryKey: tankKeys.all });
}

function parseData(type: LiveEventType, raw: unknown): LiveEventData {
  if (typeof raw !== 'string') return { type };
  const text = (value: unknown) => (typeof value === 'string' ? value : undefined);
  try {
    const data = JSON.parse(raw) as Record<string, unknown>;
    return {
      type,
      tankId: text(data.tankId),
      alertId: text(data.alertId),
      conversationId: text(data.conversationId),
      requestId: text(data.requestId),
    };
  } catch {
    return { type };
  }
}

/**
 * Opens the person's event stream and calls `onChange` for each alert or notification event, and
 * each time the stream is (re)connected: anything sent before that, while the page was loading or
 * offline, never reaches this tab. EventSource reconnects by itself after a dropped connection; a
 * refused one closes it, and it is reopened later, quietly. Returns a function that closes the stream.
 */
export function openLiveEvents(onChange: (data?: LiveEventData) => void): () => void {
  let source: EventSource | null = null;
  let reopen: number | undefined;
  let stopped = false;

  const connect = () => {
    source = new EventSource(streamUrl);
    source.addEventListener('ready', () => onChange());
    for (const type of ['alert', 'notification', 'conversation', 'urgent'] satisfies LiveEventType[]) {
      source.addEventListener(type, (event) => onChange(parseData(type, (event as MessageEvent).data)));
    }
    source.addEventListener('error', () => {
      if (source?.readyState !== EventSource.CLOSED || stopped) return;
      reopen = window.setTimeout(connect, reopenAfterMs);
    });
  };
  connect();

  return () => {
    stopped = true;
    window.clearTimeout(reopen);
    source?.close();
  };
}

/** One event stream per signed-in tab: mount once, in the app's shell. */
export function useLiveEvents() {
  const queryClient = useQueryClient();
  const { data: me } = useMe();
  const personId = me?.id;
  useEffect(() => {
    if (!personId || typeof EventSource === 'undefined') return;
    return openLiveEvents((data) => refreshAfterLiveEvent(queryClient, data));
  }, [personId, queryClient]);
}

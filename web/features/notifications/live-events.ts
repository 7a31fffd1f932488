import { useQueryClient, type Query, type QueryClient } from '@tanstack/react-query';
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
 * (its timeline); anything else (an alert, a notification, a (re)connection) everything below.
 *
 * `freshSince` is given on a stream's first `ready`: the moment it was opened. Only data read
 * before then can have missed an event, so what was fetched since, or is being fetched now, is
 * left alone; otherwise every query the page has just loaded would be fetched a second time. A
 * reconnect gives none: the connection was down for a while, and everything is refreshed.
 */
export function refreshAfterLiveEvent(
  queryClient: QueryClient,
  data: LiveEventData = {},
  freshSince?: number,
) {
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
  const readBefore =
    freshSince === undefined
      ? {}
      : {
          predicate: (query: Query) =>
            query.state.fetchStatus !== 'fetching' && query.state.dataUpdatedAt < freshSince,
        };
  void queryClient.invalidateQueries({ queryKey: conversationKeys.all, ...readBefore });
  void queryClient.invalidateQueries({ queryKey: urgentKeys.all, ...readBefore });
  void queryClient.invalidateQueries({ queryKey: alertKeys.all, ...readBefore });
  void queryClient.invalidateQueries({ queryKey: notificationKeys.inbox, ...readBefore });
  // An alert changes with the readings behind it, and tank lists and pages show both. Alert
  // events are rare (a limit crossed, an alert picked up or closed), and only queries on screen
  // refetch, so every tank query is marked stale rather than guessing which ones show this tank.
  void queryClient.invalidateQueries({ queryKey: tankKeys.all, ...readBefore });
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
 * offline, never reaches this tab. The first connection of a stream also passes the moment it was
 * opened (see refreshAfterLiveEvent). EventSource reconnects by itself after a dropped connection; a
 * refused one closes it, and it is reopened later, quietly. Returns a function that closes the stream.
 */
export function openLiveEvents(onChange: (data?: LiveEventData, freshSince?: number) => void): () => void {
  let source: EventSource | null = null;
  let reopen: number | undefined;
  let stopped = false;

  const connect = () => {
    const openedAt = Date.now();
    let connected = false;
    source = new EventSource(streamUrl);
    source.addEventListener('ready', () => {
      onChange({}, connected ? undefined : openedAt);
      connected = true;
    });
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
    return openLiveEvents((data, freshSince) => refreshAfterLiveEvent(queryClient, data, freshSince));
  }, [personId, queryClient]);
}

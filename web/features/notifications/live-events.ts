import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { useMe } from '../../lib/auth';
import { alertKeys, notificationKeys, tankKeys } from '../../lib/query-keys';

export type LiveEventType = 'alert' | 'notification';

/** What the server says changed; the client refetches rather than trusting a payload. */
export interface LiveEventData {
  tankId?: string;
  alertId?: string;
}

const streamUrl = '/api/events';
/** After the stream gives up for good (a refused or failed connection), try again this much later. */
const reopenAfterMs = 30_000;

/** Marks stale what an alert change touches: every alert list and detail, the tanks, and the inbox. */
export function refreshAfterLiveEvent(queryClient: QueryClient) {
  void queryClient.invalidateQueries({ queryKey: alertKeys.all });
  void queryClient.invalidateQueries({ queryKey: notificationKeys.inbox });
  // An alert changes with the readings behind it, and tank lists and pages show both. Alert
  // events are rare (a limit crossed, an alert picked up or closed), and only queries on screen
  // refetch, so every tank query is marked stale rather than guessing which ones show this tank.
  void queryClient.invalidateQueries({ queryKey: tankKeys.all });
}

function parseData(raw: unknown): LiveEventData {
  if (typeof raw !== 'string') return {};
  try {
    const data = JSON.parse(raw) as Record<string, unknown>;
    return {
      tankId: typeof data.tankId === 'string' ? data.tankId : undefined,
      alertId: typeof data.alertId === 'string' ? data.alertId : undefined,
    };
  } catch {
    return {};
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
    for (const type of ['alert', 'notification'] satisfies LiveEventType[]) {
      source.addEventListener(type, (event) => onChange(parseData((event as MessageEvent).data)));
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
    return openLiveEvents(() => refreshAfterLiveEvent(queryClient));
  }, [personId, queryClient]);
}

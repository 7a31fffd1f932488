import { QueryClient } from '@tanstack/react-query';
import { afterEach, describe, expect, it, vi } from 'vitest';
import {
  openLiveEvents,
  refreshAfterLiveEvent,
  type LiveEventData,
} from '../../../../web/features/notifications/live-events';
import { alertKeys, notificationKeys, tankKeys } from '../../../../web/lib/query-keys';

const openedAt = Date.parse('2026-12-01T12:00:00.000Z');
const before = openedAt - 5_000;
const after = openedAt + 200;

/** A query client holding a notification inbox read before the stream opened and a tank list read after. */
function loadedPage() {
  const queryClient = new QueryClient();
  queryClient.setQueryData(notificationKeys.inbox, [], { updatedAt: before });
  queryClient.setQueryData(tankKeys.list({}), [], { updatedAt: after });
  return queryClient;
}

const invalidated = (queryClient: QueryClient, key: readonly unknown[]) =>
  queryClient.getQueryState(key)?.isInvalidated;

describe('refreshAfterLiveEvent on a (re)connection', () => {
  it("on a stream's first ready, refreshes only what was read before the stream was opened", () => {
    const queryClient = loadedPage();

    refreshAfterLiveEvent(queryClient, {}, openedAt);

    expect(invalidated(queryClient, notificationKeys.inbox)).toBe(true);
    expect(invalidated(queryClient, tankKeys.list({}))).toBe(false);
  });

  it('on a first ready, leaves alone a query still being fetched: its answer arrives after the opening', async () => {
    const queryClient = loadedPage();
    let answer: (value: unknown[]) => void = () => {};
    const loading = queryClient.prefetchQuery({
      queryKey: alertKeys.all,
      queryFn: () => new Promise<unknown[]>((resolve) => (answer = resolve)),
    });

    refreshAfterLiveEvent(queryClient, {}, openedAt);

    expect(queryClient.getQueryState(alertKeys.all)?.fetchStatus).toBe('fetching');
    expect(invalidated(queryClient, alertKeys.all)).toBe(false);
    answer([]);
    await loading;
  });

  it('on a reconnect, refreshes everything, whenever it was read', () => {
    const queryClient = loadedPage();

    refreshAfterLiveEvent(queryClient, {});

    expect(invalidated(queryClient, notificationKeys.inbox)).toBe(true);
    expect(invalidated(queryClient, tankKeys.list({}))).toBe(true);
  });
});

/** The browser's EventSource, as far as openLiveEvents uses it: listeners and a way to fire them. */
class StreamStandIn {
  static readonly CLOSED = 2;
  static opened: StreamStandIn[] = [];
  readyState = 1;
  readonly #listeners = new Map<string, ((event: unknown) => void)[]>();
  constructor(readonly url: string) {
    StreamStandIn.opened.push(this);
  }
  addEventListener(type: string, listener: (event: unknown) => void) {
    this.#listeners.set(type, [...(this.#listeners.get(type) ?? []), listener]);
  }
  fire(type: string, data?: string) {
    for (const listener of this.#listeners.get(type) ?? []) listener({ data });
  }
  close() {
    this.readyState = StreamStandIn.CLOSED;
  }
}

describe('openLiveEvents', () => {
  afterEach(() => {
    vi.useRealTimers();
    vi.unstubAllGlobals();
    StreamStandIn.opened = [];
  });

  it("passes the opening moment with the stream's first ready only", () => {
    vi.useFakeTimers({ now: openedAt });
    vi.stubGlobal('EventSource', StreamStandIn);
    vi.stubGlobal('window', globalThis);
    const calls: [LiveEventData | undefined, number | undefined][] = [];

    const close = openLiveEvents((data, freshSince) => calls.push([data, freshSince]));
    const stream = StreamStandIn.opened[0]!;
    vi.setSystemTime(after);
    stream.fire('ready', '{}');
    stream.fire('ready', '{}');
    close();

    expect(stream.url).toBe('/api/events');
    expect(calls).toEqual([
      [{}, openedAt],
      [{}, undefined],
    ]);
    expect(stream.readyState).toBe(StreamStandIn.CLOSED);
  });
});

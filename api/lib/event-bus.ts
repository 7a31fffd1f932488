import { EventEmitter } from 'node:events';
import pg from 'pg';
import type { Logger } from './logger';

const channel = 'brinewatch_events';

/** What travels between API processes: who should hear about it, and what to refetch. */
export interface AppEvent {
  type: 'alert' | 'notification' | 'conversation' | 'urgent';
  userIds: string[];
  tankId?: string;
  alertId?: string;
  conversationId?: string;
  requestId?: string;
}

/** Sends an event to every API process (PostgreSQL NOTIFY; the payload stays far below 8 kB). */
export async function publishEvent(pool: pg.Pool, event: AppEvent): Promise<void> {
  await pool.query('select pg_notify($1, $2)', [channel, JSON.stringify(event)]);
}

export interface EventListener {
  /** Settles once the first LISTEN is in place. */
  ready: Promise<void>;
  on(listener: (event: AppEvent) => void): () => void;
  close(): Promise<void>;
}

/**
 * One LISTEN connection per process, fanned out to this process's SSE clients. It reconnects
 * when the connection drops, so a database restart does not silence the notification centre.
 */
export function listenForEvents(databaseUrl: string, logger: Logger): EventListener {
  const emitter = new EventEmitter();
  emitter.setMaxListeners(0);
  let client: pg.Client | null = null;
  let closed = false;
  let retry: NodeJS.Timeout | undefined;
  let markReady: () => void = () => {};
  const ready = new Promise<void>((resolve) => (markReady = resolve));

  const connect = async () => {
    const next = new pg.Client({ connectionString: databaseUrl });
    next.on('notification', (message) => {
      if (message.channel !== channel || !message.payload) return;
      try {
        emitter.emit('event', JSON.parse(message.payload) as AppEvent);
      } catch (error) {
        logger.warn({ err: error }, 'unreadable event');
      }
    });
    next.on('error', () => scheduleReconnect());
    try {
      await next.connect();
      await next.query(`listen ${channel}`);
      if (closed) await next.end();
      else {
        client = next;
        markReady();
      }
    } catch {
      scheduleReconnect();
    }
  };
  const scheduleReconnect = () => {
    client?.end().catch(() => {});
    client = null;
    if (!closed && !retry) retry = setTimeout(() => ((retry = undefined), void connect()), 2000);
  };
  void connect();

  return {
    ready,
    on(listener) {
      emitter.on('event', listener);
      return () => emitter.off('event', listener);
    },
    async close() {
      closed = true;
      clearTimeout(retry);
      await client?.end().catch(() => {});
    },
  };
}

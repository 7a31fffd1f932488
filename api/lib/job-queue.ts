import { PgBoss, type Queue } from 'pg-boss';
import type { AlertSeverity } from '@shared/alerts/kinds';
import type { Logger } from './logger';

/** Every queue the app uses, created at start (pg-boss refuses to send to a missing queue). */
export const queues = {
  fanOut: 'alert-fan-out',
  /** Company news to a tank's people: a published visit report or a care tip. */
  newsFanOut: 'news-fan-out',
  /** A care tip sent at its set time. */
  tipSend: 'tip-send',
  /** The one e-mail for a conversation's messages left unread (one waiting check per conversation and person). */
  conversationUnreadEmail: 'conversation-unread-email',
  email: 'deliver-email',
  push: 'deliver-push',
  dead: 'deliveries-dead',
  sweep: 'alert-sweep',
} as const;

/**
 * Job priority of an alert's fan-out and deliveries (pg-boss fetches the highest first): a critical
 * reading is told ahead of a backlog of warnings, such as a whole site's devices falling silent at
 * once after an internet outage.
 */
export const alertJobPriority: Record<AlertSeverity, number> = { critical: 2, warning: 1, notice: 0 };

/*
 * A worker that dies mid-job stops the heartbeat `work()` sends every 15 s, and the next monitor pass
 * of any live instance (pg-boss checks every 60 s) retries the job, instead of leaving it active
 * until the 15-minute expiry. The expiry stays at pg-boss's default: it bounds a live handler,
 * which must outlast the mail transport's own socket timeout, or a slow send would be retried
 * while it may still succeed.
 */
const heartbeatSeconds = 30;

/** Deliveries retry with exponential backoff for about a day before they land in the dead-letter queue. */
const deliveryRetries = {
  notify: true,
  retryLimit: 20,
  retryDelay: 1,
  retryBackoff: true,
  retryDelayMax: 15 * 60,
  deadLetter: queues.dead,
  heartbeatSeconds,
};

type QueueSettings = Omit<Queue, 'name' | 'policy' | 'partition'>;

/** `createQueue` leaves an existing queue as it was, so a database made by an older release is updated too. */
async function ensureQueue(boss: PgBoss, name: string, settings: QueueSettings) {
  await boss.createQueue(name, settings);
  await boss.updateQueue(name, settings);
}

export async function startJobQueue(databaseUrl: string, logger: Logger): Promise<PgBoss> {
  // LISTEN/NOTIFY wakes a worker the moment a notify-enabled queue gets a job (one more connection),
  // so an alert's fan-out and its push wait for no polling interval.
  const boss = new PgBoss({ connectionString: databaseUrl, max: 4, useListenNotify: true });
  // An unhandled 'error' event would end the process; log it and carry on (pg-boss retries).
  boss.on('error', (error) => logger.error({ err: error }, 'job queue error'));
  // Without LISTEN (a pooler in transaction mode) pg-boss falls back to polling: say so once.
  boss.on('warning', (warning) => logger.warn({ warning }, 'job queue warning'));
  await boss.start();
  await ensureQueue(boss, queues.dead, { retentionSeconds: 30 * 24 * 3600 });
  await ensureQueue(boss, queues.fanOut, {
    notify: true,
    retryLimit: 10,
    retryDelay: 1,
    retryBackoff: true,
    heartbeatSeconds,
  });
  await ensureQueue(boss, queues.newsFanOut, {
    notify: true,
    retryLimit: 10,
    retryDelay: 1,
    retryBackoff: true,
    heartbeatSeconds,
  });
  // The claim on the tip makes a second run a no-op; the minute sweep sends any job lost on the way.
  await ensureQueue(boss, queues.tipSend, {
    notify: true,
    retryLimit: 10,
    retryDelay: 1,
    retryBackoff: true,
    heartbeatSeconds,
  });
  // 'short': one job per singletonKey may wait, so a run of messages queues one check, not one each.
  await boss.createQueue(queues.conversationUnreadEmail, { policy: 'short' });
  await ensureQueue(boss, queues.conversationUnreadEmail, {
    retryLimit: 10,
    retryDelay: 1,
    retryBackoff: true,
    heartbeatSeconds,
  });
  await ensureQueue(boss, queues.email, deliveryRetries);
  await ensureQueue(boss, queues.push, deliveryRetries);
  await ensureQueue(boss, queues.sweep, { retryLimit: 0 });
  return boss;
}

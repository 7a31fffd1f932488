import { PgBoss } from 'pg-boss';
import type { Logger } from './logger';

/** Every queue the app uses, created at start (pg-boss refuses to send to a missing queue). */
export const queues = {
  fanOut: 'alert-fan-out',
  email: 'deliver-email',
  push: 'deliver-push',
  dead: 'deliveries-dead',
  sweep: 'alert-sweep',
} as const;

/** Deliveries retry with exponential backoff for about a day before they land in the dead-letter queue. */
const deliveryRetries = {
  retryLimit: 20,
  retryDelay: 1,
  retryBackoff: true,
  retryDelayMax: 15 * 60,
  deadLetter: queues.dead,
};

export async function startJobQueue(databaseUrl: string, logger: Logger): Promise<PgBoss> {
  const boss = new PgBoss({ connectionString: databaseUrl, max: 4 });
  // An unhandled 'error' event would end the process; log it and carry on (pg-boss retries).
  boss.on('error', (error) => logger.error({ err: error }, 'job queue error'));
  await boss.start();
  await boss.createQueue(queues.dead, { retentionSeconds: 30 * 24 * 3600 });
  await boss.createQueue(queues.fanOut, { retryLimit: 10, retryDelay: 1, retryBackoff: true });
  await boss.createQueue(queues.email, deliveryRetries);
  await boss.createQueue(queues.push, deliveryRetries);
  await boss.createQueue(queues.sweep, { retryLimit: 0 });
  return boss;
}

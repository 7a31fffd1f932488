import { eq } from 'drizzle-orm';
import { deliverEmailJob, deliverPushJob } from './deliver';
import type { Job } from 'pg-boss';
import type { AppDeps } from '../deps';
import { deliveries } from '../db/schema/index';
import { queues } from '../lib/job-queue';
import { afterAlertEvents } from './alerts';
import { deliverTip, sendDueTips } from './care-tips';
import { checkUnreadEmail, type UnreadEmailCheck } from './conversation-notify';
import { fanOutAlertEvent, fanOutCareTip, fanOutVisitReport, pendingFanOuts } from './notify';
import { unannouncedVisits } from './visits';
import { purgeExpiredAudit, sweepOverdueTests, sweepStaleDevices } from './sweeps';
import { announceInvoiceEvent, unannouncedInvoiceEvents } from './invoice-notify';
import { sweepOverdueInvoices } from './invoices';
import { maintainReadingPartitions } from './reading-partitions';
import { rejudgeStaleStatuses } from './tank-status';
import { escalateOverdueRequests, fanOutUrgentEvent, unannouncedUrgentEvents } from './urgent-notify';

type DeliveryJob = { deliveryId: string };

/**
 * Queues that carry news to people: woken by NOTIFY (job-queue.ts), polled every 10 s as a backstop
 * (every second when LISTEN is unavailable). One job a fetch, so a job that fails is retried alone
 * and holds back no other; two workers per process, so a burst of alerts is not served in single file.
 */
const prompt = {
  pollingIntervalSeconds: 1,
  notifyPollingIntervalSeconds: 10,
  localConcurrency: 2,
};

/**
 * The background half of the app, running in every API process (pg-boss hands each job to one
 * of them). Handlers are idempotent: every delivery is checked against its record before sending.
 */
export async function startWorkers(deps: AppDeps, options: { dailySweeps?: boolean } = {}) {
  const boss = deps.jobs;
  if (!boss) throw new Error('startWorkers needs the job queue');
  await boss.work<{ eventId: string }>(queues.fanOut, prompt, async (jobs) => {
    for (const job of jobs) await fanOutAlertEvent(deps, job.data.eventId);
  });
  await boss.work<{ visitId: string } | { tipId: string } | { urgentEventId: string }>(
    queues.newsFanOut,
    prompt,
    async (jobs) => {
      for (const job of jobs) {
        if ('urgentEventId' in job.data) await fanOutUrgentEvent(deps, job.data.urgentEventId);
        else if ('tipId' in job.data) await fanOutCareTip(deps, job.data.tipId);
        else await fanOutVisitReport(deps, job.data.visitId);
      }
    },
  );
  // A tip at its set time; the claim in deliverTip makes a second run (or the sweep's) a no-op.
  await boss.work<{ tipId: string }>(queues.tipSend, prompt, async (jobs) => {
    for (const job of jobs) await deliverTip(deps, job.data.tipId, undefined, { dueOnly: true });
  });
  await boss.work<UnreadEmailCheck>(queues.conversationUnreadEmail, async (jobs) => {
    for (const job of jobs) await checkUnreadEmail(deps, job.data);
  });
  await boss.work<DeliveryJob>(queues.email, prompt, async (jobs: Job<DeliveryJob>[]) => {
    for (const job of jobs) await deliverEmailJob(deps, job.data.deliveryId);
  });
  await boss.work<DeliveryJob>(queues.push, prompt, async (jobs: Job<DeliveryJob>[]) => {
    for (const job of jobs) await deliverPushJob(deps, job.data.deliveryId);
  });
  // Out of retries: the delivery is marked failed, which staff see on the deliveries list.
  await boss.work<DeliveryJob>(queues.dead, async (jobs) => {
    for (const job of jobs) {
      await deps.db
        .update(deliveries)
        .set({ status: 'failed' })
        .where(eq(deliveries.id, job.data.deliveryId));
    }
  });
  await boss.work<{ overdue?: boolean; auditRetention?: boolean; partitions?: boolean }>(
    queues.sweep,
    async (jobs) => {
      for (const job of jobs) {
        if (job.data?.auditRetention) {
          await purgeExpiredAudit(deps);
          continue;
        }
        if (job.data?.partitions) {
          await maintainReadingPartitions(deps);
          continue;
        }
        const opened = job.data?.overdue ? await sweepOverdueTests(deps) : await sweepStaleDevices(deps);
        await afterAlertEvents(deps, opened);
        for (const eventId of await pendingFanOuts(deps, 60_000)) await fanOutAlertEvent(deps, eventId);
        for (const visitId of await unannouncedVisits(deps, 60_000)) await fanOutVisitReport(deps, visitId);
        await escalateOverdueRequests(deps);
        for (const eventId of await unannouncedUrgentEvents(deps, 60_000))
          await fanOutUrgentEvent(deps, eventId);
        await sendDueTips(deps);
        await rejudgeStaleStatuses(deps.db, deps.clock());
        await sweepOverdueInvoices(deps);
        for (const eventId of await unannouncedInvoiceEvents(deps, 60_000))
          await announceInvoiceEvent(deps, eventId);
      }
    },
  );
  // The months ahead exist before any reading needs them, also after a long stop.
  await maintainReadingPartitions(deps);
  await boss.schedule(queues.sweep, '* * * * *', {}, { key: 'stale-devices' });
  await boss.schedule(queues.sweep, '15 2 * * *', { partitions: true }, { key: 'reading-partitions' });
  if (options.dailySweeps === false) {
    await boss.unschedule(queues.sweep, 'overdue-tests');
    await boss.unschedule(queues.sweep, 'audit-retention');
    return;
  }
  await boss.schedule(queues.sweep, '0 7 * * *', { overdue: true }, { key: 'overdue-tests' });
  await boss.schedule(queues.sweep, '30 3 * * *', { auditRetention: true }, { key: 'audit-retention' });
}

import { eq } from 'drizzle-orm';
import type { AppDeps } from '../deps';
import { deliveries } from '../db/schema/index';
import { deliverMessageEmail, deliverMessagePush } from './conversation-notify';
import { deliverInvoiceEmail } from './invoice-notify';
import { deliverEmail, deliverPush } from './notify';
import { deliverUrgentEmail, deliverUrgentPush } from './urgent-notify';

/*
 * The e-mail and push jobs start here: a delivery names what it tells (an alert event, a visit
 * report, a care tip, a conversation message, a change of an urgent visit request, an invoice), and each kind
 * is told by its own module. Those modules build on notify.ts, so the choice is made here, above
 * them all, rather than inside notify.ts.
 */

async function subjectOf(deps: AppDeps, deliveryId: string) {
  const [row] = await deps.db
    .select({
      messageId: deliveries.messageId,
      urgentEventId: deliveries.urgentEventId,
      invoiceEventId: deliveries.invoiceEventId,
    })
    .from(deliveries)
    .where(eq(deliveries.id, deliveryId));
  return row ?? null;
}

export async function deliverEmailJob(deps: AppDeps, deliveryId: string) {
  const subject = await subjectOf(deps, deliveryId);
  if (!subject) return;
  if (subject.messageId) return deliverMessageEmail(deps, deliveryId);
  if (subject.urgentEventId) return deliverUrgentEmail(deps, deliveryId);
  if (subject.invoiceEventId) return deliverInvoiceEmail(deps, deliveryId);
  return deliverEmail(deps, deliveryId);
}

export async function deliverPushJob(deps: AppDeps, deliveryId: string) {
  const subject = await subjectOf(deps, deliveryId);
  if (!subject) return;
  if (subject.messageId) return deliverMessagePush(deps, deliveryId);
  if (subject.urgentEventId) return deliverUrgentPush(deps, deliveryId);
  return deliverPush(deps, deliveryId);
}

import type { InvoiceStatus } from '@shared/billing/invoices';

/*
 * Back from the payment provider (`?paid=1`), the invoice is paid only once the provider's webhook
 * has told the API, which can take a moment. The page says so and reads the invoice again every two
 * seconds until it is paid; after two minutes it stops asking and says, calmly, what happens next.
 */

export const confirmEveryMs = 2_000;
export const confirmForMs = 120_000;

export type PaymentWait =
  /** Not back from paying. */
  | 'none'
  | 'confirming'
  | 'paid'
  /** Still not confirmed after `confirmForMs`: the page stops asking. */
  | 'slow';

export function paymentWait(
  returned: boolean,
  status: InvoiceStatus | undefined,
  elapsedMs: number,
): PaymentWait {
  if (!returned) return 'none';
  if (status === 'paid') return 'paid';
  return elapsedMs >= confirmForMs ? 'slow' : 'confirming';
}

/** How often to read the invoice again in each state; false is never. */
export const refetchEvery = (wait: PaymentWait): number | false =>
  wait === 'confirming' ? confirmEveryMs : false;

export const paymentWaitMessages: Readonly<Record<Exclude<PaymentWait, 'none'>, string>> = {
  confirming: 'Payment received — confirming with the payment provider…',
  paid: 'Paid — thank you. A receipt is on its way by e-mail.',
  slow: 'The payment provider has not confirmed your payment yet. There is no need to pay again: this invoice shows as paid once it does, and the receipt comes by e-mail. Reload this page later to see it.',
};

import { useMutation } from '@tanstack/react-query';
import type { CheckoutStarted } from '@shared/schemas/billing';
import { api } from '../../../lib/api-client';

/** The payment provider's hosted page for this invoice; the caller sends the browser there. */
export const startCheckout = (invoiceId: string) =>
  api<CheckoutStarted>(`/invoices/${invoiceId}/checkout`, { method: 'POST' });

export const useStartCheckout = (invoiceId: string) =>
  useMutation({ mutationFn: () => startCheckout(invoiceId) });

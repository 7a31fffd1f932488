import type { InvoiceDetail } from '@shared/schemas/billing';
import { Button } from '../../../components/button';
import { problemMessage } from '../../../lib/problem-message';
import { useStartCheckout } from '../api/start-checkout';

/**
 * Sends the owner to the payment provider's own page for this invoice; the provider brings them
 * back to `?paid=1`. A refusal (already paid, online payment switched off) goes to `onRefused` in
 * the API's words, for the page to say even if the button goes away once the invoice is read again.
 */
export function PayNow({
  invoice,
  onRefused,
}: {
  invoice: InvoiceDetail;
  onRefused: (message: string) => void;
}) {
  const checkout = useStartCheckout(invoice.id);
  // Stays "opening" after success: the browser is leaving for the provider's page.
  const busy = checkout.isPending || checkout.isSuccess;
  return (
    <Button
      onClick={() =>
        checkout.mutate(undefined, {
          onSuccess: ({ url }) => window.location.assign(url),
          onError: (error) => onRefused(problemMessage(error)),
        })
      }
      disabled={busy}
    >
      {busy ? 'Opening the payment page…' : 'Pay now'}
    </Button>
  );
}

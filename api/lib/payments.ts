import Stripe from 'stripe';
import type { Env } from '../env';

/**
 * The payment provider's official SDK, configured once. Online payment is on only when both the
 * secret key and the webhook signing secret are set: a payment whose result could not come back
 * through a verified webhook would never mark its invoice paid. STRIPE_API_URL points the SDK at
 * the local stand-in (api/dev/payment-provider.ts) through its own host/port/protocol settings.
 */
export interface PaymentProvider {
  stripe: Stripe;
  webhookSecret: string;
}

export function createPaymentProvider(env: Env): PaymentProvider | null {
  if (!env.STRIPE_SECRET_KEY || !env.STRIPE_WEBHOOK_SECRET) return null;
  const target = env.STRIPE_API_URL ? new URL(env.STRIPE_API_URL) : null;
  const stripe = new Stripe(env.STRIPE_SECRET_KEY, {
    maxNetworkRetries: 2,
    timeout: 20_000,
    ...(target && {
      host: target.hostname,
      port: Number(target.port || (target.protocol === 'https:' ? 443 : 80)),
      protocol: target.protocol === 'https:' ? 'https' : 'http',
    }),
  });
  return { stripe, webhookSecret: env.STRIPE_WEBHOOK_SECRET };
}

import Stripe from 'stripe';
import type { AppConfig } from '../../config.ts';
import { AppError } from '../../lib/errors.ts';

/**
 * The official SDK, pointed at `PAYMENTS_URL` (the local fake in development and tests) or, when that is unset and
 * a secret key is given in production, at the real service. Null when payments are not set up at all.
 */
export function createPaymentsClient(config: AppConfig): Stripe | null {
  const { url, secretKey } = config.payments;
  if (!secretKey) return null;
  if (!url) return config.env === 'production' ? new Stripe(secretKey, { maxNetworkRetries: 1, timeout: 15_000 }) : null;
  const target = new URL(url);
  return new Stripe(secretKey, {
    host: target.hostname,
    port: Number(target.port || (target.protocol === 'https:' ? 443 : 80)),
    protocol: target.protocol === 'https:' ? 'https' : 'http',
    // A runner is waiting on the answer: one quick try, then a clear sentence.
    maxNetworkRetries: 0,
    timeout: 10_000,
  });
}

export function paymentsUnavailable(): AppError {
  return new AppError(
    503,
    'payments-unavailable',
    'The payment service cannot be reached just now, so nothing was charged. Please try again in a few minutes.',
  );
}

/** Runs a call to the service; a connection or service failure becomes the 503 sentence above. */
export async function callService<T>(call: () => Promise<T>): Promise<T> {
  try {
    return await call();
  } catch (err) {
    if (err instanceof Stripe.errors.StripeError) throw paymentsUnavailable();
    throw err;
  }
}

/** Verifies signatures only; needs no key. */
export const signatureChecker = new Stripe('sk_signature_check_only');

import Stripe from 'stripe';
import { env } from '../env';

/**
 * The payment provider's official SDK. PAYMENTS_API_URL points it at another host (the local
 * fake in development and tests); unset, it talks to the real API. Nothing else in the app
 * knows which one answers.
 */
export function createStripe(settings: { secretKey: string; apiUrl?: string | undefined }): Stripe {
  const target = settings.apiUrl ? new URL(settings.apiUrl) : null;
  return new Stripe(settings.secretKey, {
    ...(target
      ? {
          host: target.hostname,
          port: Number(target.port || (target.protocol === 'https:' ? 443 : 80)),
          protocol: target.protocol === 'https:' ? 'https' : 'http',
        }
      : {}),
    // One retry with the SDK's idempotency key covers a dropped connection without double charges.
    maxNetworkRetries: 1,
    timeout: 15_000,
    appInfo: { name: 'Roundmark' },
  });
}

let shared: Stripe | undefined;

/** The process-wide client, built from the environment on first use. */
export function stripe(): Stripe {
  shared ??= createStripe({ secretKey: env().PAYMENTS_SECRET_KEY, apiUrl: env().PAYMENTS_API_URL });
  return shared;
}

/** The secret our webhook endpoint verifies the platform's own events with. */
export const webhookSecret = () => env().PAYMENTS_WEBHOOK_SECRET;

/** Every secret an event may be signed with: the platform endpoint's, then the connected accounts' endpoint's. */
export const webhookSecrets = (): string[] => [env().PAYMENTS_WEBHOOK_SECRET, ...(env().PAYMENTS_CONNECT_WEBHOOK_SECRET ? [env().PAYMENTS_CONNECT_WEBHOOK_SECRET!] : [])];

import { contentSecurityPolicy, scriptHashesIn } from '~/lib/security/content-security-policy';
import { env } from '../env';
import { signedMediaUrl } from '../media/media-urls';
import { storage } from '../storage';

/** The payment provider's hosted payment page when no local stand-in is configured. */
const PROVIDER_CHECKOUT_ORIGIN = 'https://checkout.stripe.com';
/** The payment provider's hosted onboarding for connected accounts when no local stand-in is configured. */
const PROVIDER_ONBOARDING_ORIGIN = 'https://connect.stripe.com';

let origins: Promise<{ objectStoreOrigin: string; checkoutOrigin: string; onboardingOrigin: string }> | undefined;

/**
 * The origins the policy allows besides our own, worked out once per process. The object store's
 * is read off a presigned URL made by the same presigner the media links use (signing is local,
 * nothing is sent), so it is exactly the origin members' browsers will fetch from — path-style or
 * bucket-in-host, custom endpoint or not.
 */
function policyOrigins() {
  origins ??= (async () => {
    const { s3, bucket } = storage();
    const probe = await signedMediaUrl(s3, bucket, 'content-security-policy-probe', 60);
    const payments = env().PAYMENTS_API_URL;
    return {
      objectStoreOrigin: new URL(probe).origin,
      checkoutOrigin: payments ? new URL(payments).origin : PROVIDER_CHECKOUT_ORIGIN,
      onboardingOrigin: payments ? new URL(payments).origin : PROVIDER_ONBOARDING_ORIGIN,
    };
  })().catch((e: unknown) => {
    origins = undefined;
    throw e;
  });
  return origins;
}

/**
 * Headers on every answer: the Content-Security-Policy (with the hashes of the inline scripts
 * Astro wrote into this page, if any), no MIME sniffing, the origin only as referrer to other
 * sites, HSTS over HTTPS, and nothing personal kept in shared or browser caches. Media keeps its
 * own private caching.
 */
export async function withSecurityHeaders(response: Response, { signedIn, https }: { signedIn: boolean; https: boolean }): Promise<Response> {
  const policy = contentSecurityPolicy({ ...(await policyOrigins()), scriptHashes: scriptHashesIn(response.headers.get('content-security-policy')) });
  const h = response.headers;
  try {
    h.set('content-security-policy', policy);
    h.set('x-content-type-options', 'nosniff');
    h.set('referrer-policy', 'strict-origin-when-cross-origin');
    if (https) h.set('strict-transport-security', 'max-age=31536000; includeSubDomains');
    const cache = h.get('cache-control');
    if (signedIn && !(cache && /\bprivate\b|\bno-store\b/.test(cache))) h.set('cache-control', 'private, no-store');
  } catch {
    // A response with immutable headers (a redirect made by the framework) goes out as it is.
  }
  return response;
}

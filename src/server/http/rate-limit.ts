import type { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { AppError } from '../errors';

const isLimiterRes = (e: unknown): e is RateLimiterRes =>
  typeof e === 'object' && e !== null && 'msBeforeNext' in e && !(e instanceof Error);

/**
 * Counts one request against each limiter in turn (address first, so one noisy address cannot
 * use up a stranger's per-account allowance) and throws rate_limited with the wait when one is spent.
 */
export async function consumeEach(
  steps: Array<[RateLimiterPostgres, string]>,
  message: (minutes: number) => string,
): Promise<void> {
  for (const [limiter, key] of steps) {
    try {
      await limiter.consume(key);
    } catch (err) {
      if (!isLimiterRes(err)) throw err;
      const minutes = Math.max(1, Math.ceil(err.msBeforeNext / 60_000));
      throw new AppError('rate_limited', message(minutes), undefined, { retryAfterSeconds: Math.ceil(err.msBeforeNext / 1000) });
    }
  }
}

export const pleaseWait = (what: string) => (minutes: number) =>
  `Too many ${what} from here. Please wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again.`;

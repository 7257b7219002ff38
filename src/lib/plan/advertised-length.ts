/**
 * The one rule for "does this length match the advertised length": within ±percent of the
 * advertised minutes (a Roundmark house rule, not a standard). The timing check and the plan
 * builder both use it, so the builder warns exactly when the check would.
 */
import { toMillis } from '../time/format-time';

export interface AdvertisedComparison {
  advertisedSeconds: number;
  allowedSeconds: number;
  /** Length minus advertised length, in seconds. */
  diffSeconds: number;
  within: boolean;
}

/** Null when no advertised length is set. */
export function compareWithAdvertised(seconds: number, advertisedMinutes: number | null | undefined, percent: number): AdvertisedComparison | null {
  if (advertisedMinutes === null || advertisedMinutes === undefined || advertisedMinutes <= 0) return null;
  const advertisedSeconds = advertisedMinutes * 60;
  const allowedSeconds = (advertisedSeconds * percent) / 100;
  const diffSeconds = seconds - advertisedSeconds;
  return { advertisedSeconds, allowedSeconds, diffSeconds, within: Math.abs(toMillis(diffSeconds)) <= toMillis(allowedSeconds) };
}

import { DateTime } from 'luxon';

/**
 * Turning a wall-clock time in a studio's zone ("2026-03-30T09:00" in Europe/Berlin) into an
 * instant needs the zone's offset on that day, which `Intl` can print but not solve for; luxon
 * (maintained, runs in Node 20 and browsers, reads the platform's IANA data) does it. Kept apart
 * from date-format.ts so islands that only format never load luxon.
 */

/** The `datetime-local` shape: "2026-03-30T09:00". */
const WALL_CLOCK = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/;

export type WallClockResult =
  | { ok: true; at: Date }
  /** unreadable: not a date and time; skipped: the clocks jump over it that day (spring forward). */
  | { ok: false; reason: 'unreadable' | 'skipped' };

/**
 * The instant a wall-clock time names in a zone. A time the clocks skip (02:30 on the last
 * Sunday of March in Europe/Berlin) is refused rather than moved; a time that happens twice
 * (02:30 on the last Sunday of October) is its first occurrence, luxon's rule.
 */
export function wallClockToInstant(local: string | undefined, timeZone: string): WallClockResult {
  if (!local || !WALL_CLOCK.test(local)) return { ok: false, reason: 'unreadable' };
  const dt = DateTime.fromISO(local, { zone: timeZone });
  if (!dt.isValid) return { ok: false, reason: 'unreadable' };
  // luxon moves a skipped time forward; reading it back shows the move.
  if (dt.toFormat("yyyy-MM-dd'T'HH:mm") !== local) return { ok: false, reason: 'skipped' };
  return { ok: true, at: dt.toJSDate() };
}

/** An instant as the `datetime-local` value for a zone, to fill a form with a stored schedule. */
export function instantToWallClock(at: Date, timeZone: string): string {
  return DateTime.fromJSDate(at, { zone: timeZone }).toFormat("yyyy-MM-dd'T'HH:mm");
}

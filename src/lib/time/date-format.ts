/**
 * The one place that turns instants into dates and times people read. Every page, island and
 * e-mail formats with the studio's own locale and time zone (its "clock"), through
 * `Intl.DateTimeFormat`, so a member in Berlin and the server in UTC see the same studio day.
 * Pure: runs on the server and in the browser.
 */

/** How a studio reads dates: a BCP 47 locale and an IANA time zone. */
export interface StudioClock {
  locale: string;
  timeZone: string;
}

/** For pages without a studio (a visitor, an account with no studio yet). */
export const DEFAULT_CLOCK: StudioClock = { locale: 'en-GB', timeZone: 'UTC' };

/** The studio's clock when it has one; the default otherwise. */
export function clockOf(studio: Partial<StudioClock> | null | undefined): StudioClock {
  return { locale: studio?.locale || DEFAULT_CLOCK.locale, timeZone: studio?.timeZone || DEFAULT_CLOCK.timeZone };
}

const STYLES = {
  /** "14 March 2026" */
  day: { day: 'numeric', month: 'long', year: 'numeric' },
  /** "Saturday 14 March 2026" (e-mails) */
  weekday: { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric' },
  /** "14 Mar 2026, 09:30" */
  dateTime: { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' },
  /** "14 Mar 2026, 09:30:05" (logs people read, such as sent mail) */
  stamp: { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', second: '2-digit' },
  /** "09:30" */
  time: { hour: '2-digit', minute: '2-digit' },
} as const satisfies Record<string, Intl.DateTimeFormatOptions>;

export type DateStyle = keyof typeof STYLES;

// Building an Intl.DateTimeFormat is costly next to using one: keep one per clock and style.
const formatters = new Map<string, Intl.DateTimeFormat>();
function formatter(clock: StudioClock, options: Intl.DateTimeFormatOptions, key: string): Intl.DateTimeFormat {
  const id = `${clock.locale}|${clock.timeZone}|${key}`;
  let f = formatters.get(id);
  if (!f) {
    f = new Intl.DateTimeFormat(clock.locale, { ...options, timeZone: clock.timeZone });
    formatters.set(id, f);
  }
  return f;
}

const toDate = (at: Date | string | number) => (at instanceof Date ? at : new Date(at));

/** An instant as the studio reads it; "—" when there is none. */
export function formatInstant(at: Date | string | number | null | undefined, clock: StudioClock, style: DateStyle = 'dateTime'): string {
  if (at === null || at === undefined || at === '') return '—';
  const d = toDate(at);
  if (Number.isNaN(d.getTime())) return '—';
  // Some locales put a comma after the weekday ("Saturday, 14 March"); the e-mails read without it.
  const text = formatter(clock, STYLES[style], style).format(d);
  return style === 'weekday' ? text.replace(',', '') : text;
}

/** The zone's short name at that instant in the studio's locale, e.g. "CET" or "CEST" (or "GMT+1"). */
export function zoneAbbreviation(at: Date | string | number, clock: StudioClock): string {
  const parts = formatter(clock, { timeZoneName: 'short' }, 'zone').formatToParts(toDate(at));
  return parts.find((p) => p.type === 'timeZoneName')?.value ?? clock.timeZone;
}

/**
 * A scheduled time with its zone named, so nobody guesses whose clock it is:
 * "30 Mar 2026, 09:00 CEST (Europe/Berlin)".
 */
export function formatScheduled(at: Date | string | number, clock: StudioClock): string {
  return `${formatInstant(at, clock, 'dateTime')} ${zoneAbbreviation(at, clock)} (${clock.timeZone})`;
}

/** Whether the platform knows this IANA time zone name ("Europe/Berlin", "UTC"). */
export function isTimeZone(name: string): boolean {
  if (!name || name.length > 64) return false;
  try {
    new Intl.DateTimeFormat('en', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

/** Whether the platform can format dates in this locale ("en-GB", "de-DE"). */
export function isLocale(tag: string): boolean {
  if (!tag || tag.length > 35) return false;
  try {
    return Intl.DateTimeFormat.supportedLocalesOf([tag]).length === 1;
  } catch {
    return false;
  }
}

/** Every time zone the platform knows, for a picker (UTC first: Node 20's list leaves it out). */
export function timeZoneNames(): string[] {
  const names = typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : [];
  return ['UTC', ...names.filter((n) => n !== 'UTC')];
}

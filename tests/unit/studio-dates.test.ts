import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { clockOf, DEFAULT_CLOCK, formatInstant, formatScheduled, isLocale, isTimeZone, timeZoneNames, zoneAbbreviation } from '~/lib/time/date-format';
import { instantToWallClock, wallClockToInstant } from '~/lib/time/wall-clock';
import { studioClockInput } from '~/lib/api/studio-schemas';

const berlin = { locale: 'en-GB', timeZone: 'Europe/Berlin' };

/*
 * Europe/Berlin's clock changes, from the IANA tz database (file `europe`, here read in its
 * compact form /usr/share/zoneinfo/tzdata.zi, version 2025b, as Debian ships it):
 *   R E 1981 ma - Mar lastSu 1u 1 S     summer time from the last Sunday of March, 01:00 UTC
 *   R E 1996 ma - O lastSu 1u 0 -       back on the last Sunday of October, 01:00 UTC
 *   Z Europe/Berlin … 1 E CE%sT         UTC+1 (CET), plus one hour in summer (CEST)
 * 2026: the last Sundays are 29 March and 25 October, so on 30 March Berlin is UTC+2 and on
 * 26 October it is UTC+1 again. `zdump -v -c 2026,2027 Europe/Berlin` on this machine agrees
 * (29 Mar 01:00:00 UT = 03:00 CEST; 25 Oct 01:00:00 UT = 02:00 CET). Worked by hand from the rules.
 */
describe('a scheduled publish in Europe/Berlin is the instant the rules give (IANA tz database)', () => {
  it.each([
    ['2026-03-28T09:00', '2026-03-28T08:00:00.000Z', 'Saturday before the March change: CET, UTC+1'],
    ['2026-03-30T09:00', '2026-03-30T07:00:00.000Z', 'Monday after the March change: CEST, UTC+2'],
    ['2026-10-24T09:00', '2026-10-24T07:00:00.000Z', 'Saturday before the October change: CEST, UTC+2'],
    ['2026-10-26T09:00', '2026-10-26T08:00:00.000Z', 'Monday after the October change: CET, UTC+1'],
  ])('%s in Berlin is %s (%s)', (local, instant) => {
    const read = wallClockToInstant(local, 'Europe/Berlin');
    expect(read).toEqual({ ok: true, at: new Date(instant) });
  });

  it('would be an hour off if read with the offset of the day it was entered (the old way)', () => {
    // Entered on a winter day (offset -60 min, as Date#getTimezoneOffset gives for CET) for the
    // Monday after the change: the old reading gave 08:00 UTC, which is 10:00 in Berlin.
    const oldWay = new Date(Date.parse('2026-03-30T09:00:00Z') - 60 * 60_000);
    const read = wallClockToInstant('2026-03-30T09:00', 'Europe/Berlin');
    expect(read.ok && read.at.getTime() - oldWay.getTime()).toBe(-3_600_000);
  });

  it('refuses a time the clocks skip (02:30 on 29 March 2026 does not happen in Berlin)', () => {
    expect(wallClockToInstant('2026-03-29T02:30', 'Europe/Berlin')).toEqual({ ok: false, reason: 'skipped' });
    expect(wallClockToInstant('2026-03-29T03:00', 'Europe/Berlin')).toEqual({ ok: true, at: new Date('2026-03-29T01:00:00Z') });
  });

  it('reads a time that happens twice (02:30 on 25 October 2026) as one of its two instants', () => {
    // 02:30 CEST = 00:30 UTC and 02:30 CET = 01:30 UTC both exist; luxon takes the CET one.
    const read = wallClockToInstant('2026-10-25T02:30', 'Europe/Berlin');
    expect(read).toEqual({ ok: true, at: new Date('2026-10-25T01:30:00Z') });
  });

  it('refuses text that is no datetime-local value', () => {
    for (const bad of [undefined, '', '2026-03-30', '2026-13-01T09:00', '2026-02-30T09:00', '2026-03-30T25:00', '2026-03-30 09:00'])
      expect(wallClockToInstant(bad, 'Europe/Berlin').ok).toBe(false);
  });

  it('fills the form back with the same wall-clock time', () => {
    expect(instantToWallClock(new Date('2026-03-30T07:00:00Z'), 'Europe/Berlin')).toBe('2026-03-30T09:00');
    expect(instantToWallClock(new Date('2026-10-26T08:00:00Z'), 'Europe/Berlin')).toBe('2026-10-26T09:00');
  });

  it.runIf(existsSync('/usr/share/zoneinfo/tzdata.zi'))('the rules quoted above are the ones this machine ships', () => {
    const zi = readFileSync('/usr/share/zoneinfo/tzdata.zi', 'utf8').split('\n');
    expect(zi).toContain('R E 1981 ma - Mar lastSu 1u 1 S');
    expect(zi).toContain('R E 1996 ma - O lastSu 1u 0 -');
  });
});

describe('formatting with the studio’s locale and zone', () => {
  const after = new Date('2026-03-30T07:00:00Z');
  it('writes each style in the studio’s zone', () => {
    expect(formatInstant(after, berlin, 'day')).toBe('30 March 2026');
    expect(formatInstant(after, berlin, 'time')).toBe('09:00');
    expect(formatInstant(after, berlin, 'dateTime')).toBe('30 Mar 2026, 09:00');
    expect(formatInstant(after, berlin, 'weekday')).toBe('Monday 30 March 2026');
    expect(formatInstant(after, berlin, 'stamp')).toBe('30 Mar 2026, 09:00:00');
  });

  it('names the day in the studio’s zone, not the server’s (23:30 UTC is already tomorrow in Berlin)', () => {
    const late = new Date('2026-06-14T23:30:00Z');
    expect(formatInstant(late, berlin, 'day')).toBe('15 June 2026');
    expect(formatInstant(late, DEFAULT_CLOCK, 'day')).toBe('14 June 2026');
  });

  it('follows the studio’s locale', () => {
    expect(formatInstant(after, { locale: 'de-DE', timeZone: 'Europe/Berlin' }, 'day')).toBe('30. März 2026');
    expect(formatInstant(after, { locale: 'en-US', timeZone: 'America/New_York' }, 'day')).toBe('March 30, 2026');
  });

  it('labels a scheduled time with the zone’s short name on that day and its IANA name', () => {
    expect(formatScheduled(after, berlin)).toBe('30 Mar 2026, 09:00 CEST (Europe/Berlin)');
    expect(formatScheduled(new Date('2026-10-26T08:00:00Z'), berlin)).toBe('26 Oct 2026, 09:00 CET (Europe/Berlin)');
    expect(zoneAbbreviation(after, DEFAULT_CLOCK)).toBe('UTC');
  });

  it('shows a dash for a missing or unreadable date', () => {
    expect(formatInstant(null, berlin)).toBe('—');
    expect(formatInstant('not a date', berlin)).toBe('—');
  });

  it('falls back to the default clock without a studio', () => {
    expect(clockOf(null)).toEqual(DEFAULT_CLOCK);
    expect(clockOf({ timeZone: 'Asia/Tokyo' })).toEqual({ locale: 'en-GB', timeZone: 'Asia/Tokyo' });
  });
});

describe('studio clock settings', () => {
  it('knows IANA zones and locales, and refuses made-up ones', () => {
    expect(isTimeZone('Europe/Berlin')).toBe(true);
    expect(isTimeZone('UTC')).toBe(true);
    expect(isTimeZone('Mars/Olympus_Mons')).toBe(false);
    expect(isTimeZone('')).toBe(false);
    expect(isLocale('de-DE')).toBe(true);
    expect(isLocale('not a locale!')).toBe(false);
  });

  it('offers UTC first and every zone the platform knows', () => {
    const names = timeZoneNames();
    expect(names[0]).toBe('UTC');
    expect(names).toContain('Europe/Berlin');
    expect(new Set(names).size).toBe(names.length);
  });

  it('the settings schema names the field it refuses', () => {
    const r = studioClockInput.safeParse({ timeZone: 'Europe/Atlantis', locale: 'en-GB' });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(['timeZone']);
    expect(studioClockInput.parse({ timeZone: ' Europe/Berlin ', locale: 'en-GB' })).toEqual({ timeZone: 'Europe/Berlin', locale: 'en-GB' });
  });
});

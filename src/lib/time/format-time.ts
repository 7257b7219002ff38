/**
 * Time formatting and parsing shared by the editor, the player, the timing check and
 * the import/export formats. Pure: runs on the server and in the browser.
 *
 * Every function works on whole milliseconds internally, so that 0.1 + 0.2 style float
 * noise never shows up in a label or a file.
 */

/** Rounds seconds to whole milliseconds (the precision of every stored time). */
export function roundToMillis(seconds: number): number {
  return Math.round(seconds * 1000) / 1000;
}

/** Seconds as whole milliseconds (an integer), for exact comparisons. */
export function toMillis(seconds: number): number {
  return Math.round(seconds * 1000);
}

const pad2 = (n: number): string => String(n).padStart(2, '0');
const pad3 = (n: number): string => String(n).padStart(3, '0');

interface ClockParts {
  sign: string;
  hours: number;
  minutes: number;
  seconds: number;
  fraction: number;
}

/** Splits a time into parts after rounding to `digits` fraction digits (0, 1 or 3). */
function splitClock(seconds: number, digits: 0 | 1 | 3): ClockParts {
  const unit = 10 ** digits;
  const total = Math.round(Math.abs(seconds) * unit);
  const sign = seconds < 0 && total > 0 ? '-' : '';
  const fraction = total % unit;
  const wholeSeconds = (total - fraction) / unit;
  return {
    sign,
    hours: Math.floor(wholeSeconds / 3600),
    minutes: Math.floor((wholeSeconds % 3600) / 60),
    seconds: wholeSeconds % 60,
    fraction,
  };
}

function joinClock(p: ClockParts, fraction: string): string {
  const base =
    p.hours > 0 ? `${p.hours}:${pad2(p.minutes)}:${pad2(p.seconds)}` : `${p.minutes}:${pad2(p.seconds)}`;
  return `${p.sign}${base}${fraction}`;
}

/**
 * Clock time as the design brief asks: `m:ss` under an hour, `h:mm:ss` from an hour on.
 * Rounded to the nearest second. Digits are ASCII, so a tabular-figures font lines them up.
 */
export function formatClock(seconds: number): string {
  return joinClock(splitClock(seconds, 0), '');
}

/** Editor time with tenths: `m:ss.s` under an hour, `h:mm:ss.s` above. */
export function formatEditorTime(seconds: number): string {
  const p = splitClock(seconds, 1);
  return joinClock(p, `.${p.fraction}`);
}

/** Exact time with milliseconds: `m:ss.sss` / `h:mm:ss.sss` (the CSV format). */
export function formatPreciseTime(seconds: number): string {
  const p = splitClock(seconds, 3);
  return joinClock(p, `.${pad3(p.fraction)}`);
}

/**
 * A length for messages: under a minute as `40 s` (or `9.4 s`), otherwise as a clock
 * (`1:30`, `1:30.5`): tenths appear only when the length is not a whole second.
 */
export function formatLength(seconds: number): string {
  const tenths = Math.round(Math.abs(seconds) * 10);
  if (tenths < 600) {
    const text = tenths % 10 === 0 ? String(tenths / 10) : (tenths / 10).toFixed(1);
    return `${seconds < 0 && tenths > 0 ? '-' : ''}${text} s`;
  }
  return tenths % 10 === 0 ? formatClock(seconds) : formatEditorTime(seconds);
}

/** The outcome of parsing a time typed by a person or read from a file. */
export type ParsedTime = { ok: true; seconds: number } | { ok: false; message: string };

const CLOCK_PATTERN = /^(?:(\d+):)?(\d+):(\d+(?:\.\d+)?)$/;
const SECONDS_PATTERN = /^\d+(?:\.\d+)?$/;

/**
 * Parses `m:ss.sss`, `h:mm:ss.sss` or plain seconds (`93.5`). Fractions of any length are
 * accepted and rounded to milliseconds. Seconds (and minutes, when hours are given) must be
 * below 60. Negative times are refused: recordings start at zero.
 */
export function parseTime(text: string): ParsedTime {
  const value = text.trim();
  if (value === '') return { ok: false, message: 'The time is empty.' };
  if (SECONDS_PATTERN.test(value)) return { ok: true, seconds: roundToMillis(Number(value)) };
  const match = CLOCK_PATTERN.exec(value);
  if (!match) {
    return { ok: false, message: `"${value}" is not a time. Write it as m:ss.sss, h:mm:ss.sss or seconds.` };
  }
  const hours = match[1] === undefined ? 0 : Number(match[1]);
  const minutes = Number(match[2]);
  const secs = Number(match[3]);
  if (secs >= 60) return { ok: false, message: `"${value}" has ${match[3]} seconds; seconds must be below 60.` };
  if (match[1] !== undefined && minutes >= 60) {
    return { ok: false, message: `"${value}" has ${match[2]} minutes; with hours given, minutes must be below 60.` };
  }
  return { ok: true, seconds: roundToMillis(hours * 3600 + minutes * 60 + secs) };
}

/**
 * WebVTT timestamp (W3C WebVTT §4.1): `[hh:]mm:ss.ttt`, hours only when non-zero and then
 * at least two digits, exactly three fraction digits.
 */
export function formatVttTimestamp(seconds: number): string {
  const p = splitClock(Math.max(0, seconds), 3);
  const tail = `${pad2(p.minutes)}:${pad2(p.seconds)}.${pad3(p.fraction)}`;
  return p.hours > 0 ? `${pad2(p.hours)}:${tail}` : tail;
}

const VTT_TIMESTAMP = /^(?:(\d{2,}):)?(\d{2}):(\d{2})\.(\d{3})$/;

/**
 * Parses a WebVTT timestamp strictly as W3C WebVTT §4.1 defines it: minutes and seconds
 * two digits each and 00–59, exactly three fraction digits, hours (2+ digits) optional.
 */
export function parseVttTimestamp(text: string): ParsedTime {
  const match = VTT_TIMESTAMP.exec(text);
  if (!match) {
    return { ok: false, message: `"${text}" is not a WebVTT timestamp; write it as mm:ss.ttt or hh:mm:ss.ttt.` };
  }
  const minutes = Number(match[2]);
  const secs = Number(match[3]);
  if (minutes > 59 || secs > 59) {
    return { ok: false, message: `"${text}" has minutes or seconds above 59.` };
  }
  const hours = match[1] === undefined ? 0 : Number(match[1]);
  return { ok: true, seconds: (hours * 3600_000 + minutes * 60_000 + secs * 1000 + Number(match[4])) / 1000 };
}

/**
 * ISO 8601 duration for schema.org `duration` (e.g. 1670 s -> `PT27M50S`). Always uses the
 * time designator `T` (`P10M` would mean ten months). Milliseconds appear as a decimal
 * fraction of the seconds; zero is `PT0S`.
 */
export function formatIsoDuration(seconds: number): string {
  const total = Math.max(0, toMillis(seconds));
  const millis = total % 1000;
  const whole = (total - millis) / 1000;
  const hours = Math.floor(whole / 3600);
  const minutes = Math.floor((whole % 3600) / 60);
  const secs = whole % 60;
  let out = 'PT';
  if (hours > 0) out += `${hours}H`;
  if (minutes > 0) out += `${minutes}M`;
  if (secs > 0 || millis > 0 || (hours === 0 && minutes === 0)) {
    out += millis > 0 ? `${secs}.${pad3(millis).replace(/0+$/, '')}S` : `${secs}S`;
  }
  return out;
}

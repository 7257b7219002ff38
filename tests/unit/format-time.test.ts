import { describe, expect, it } from 'vitest';
import {
  formatClock,
  formatEditorTime,
  formatIsoDuration,
  formatLength,
  formatPreciseTime,
  formatVttTimestamp,
  parseTime,
  parseVttTimestamp,
} from '~/lib/time/format-time';

describe('formatClock (design brief: m:ss under an hour, h:mm:ss above)', () => {
  it.each([
    [0, '0:00'],
    [9, '0:09'],
    [59.4, '0:59'],
    [59.6, '1:00'],
    [1670, '27:50'],
    [3599, '59:59'],
    [3600, '1:00:00'],
    [3725, '1:02:05'],
  ])('%s s -> %s', (s, text) => expect(formatClock(s)).toBe(text));
});

describe('formatEditorTime (tenths in the editor: m:ss.s)', () => {
  it.each([
    [0, '0:00.0'],
    [9.44, '0:09.4'],
    [9.96, '0:10.0'],
    [3723.25, '1:02:03.3'],
  ])('%s s -> %s', (s, text) => expect(formatEditorTime(s)).toBe(text));
});

describe('formatPreciseTime and formatLength', () => {
  it.each([
    [0.001, '0:00.001'],
    [83.5, '1:23.500'],
    [0.1 + 0.2, '0:00.300'],
    [3600.999, '1:00:00.999'],
  ])('precise %s -> %s', (s, text) => expect(formatPreciseTime(s)).toBe(text));
  it.each([
    [40, '40 s'],
    [9.4, '9.4 s'],
    [90, '1:30'],
    [90.5, '1:30.5'],
  ])('length %s -> %s', (s, text) => expect(formatLength(s)).toBe(text));
});

describe('parseTime', () => {
  it.each([
    ['83.5', 83.5],
    ['1:23.5', 83.5],
    ['1:23.456', 83.456],
    ['01:02:03.004', 3723.004],
    ['75:00', 4500],
    ['0:00.0004', 0],
  ])('%s -> %s', (text, seconds) => expect(parseTime(text)).toEqual({ ok: true, seconds }));
  it.each(['', 'abc', '1:60', '1:61:00', '-5', '1::2', '1:2:3:4'])('refuses %j', (text) => {
    expect(parseTime(text).ok).toBe(false);
  });
});

describe('WebVTT timestamps (W3C WebVTT §4.1: [hh:]mm:ss.ttt, hours only when non-zero)', () => {
  it.each([
    [0, '00:00.000'],
    [83.456, '01:23.456'],
    [3599.999, '59:59.999'],
    [3600, '01:00:00.000'],
    [36000 * 10 + 1.5, '100:00:01.500'],
  ])('%s s -> %s', (s, text) => {
    expect(formatVttTimestamp(s)).toBe(text);
    expect(parseVttTimestamp(text)).toEqual({ ok: true, seconds: s });
  });
  // §4.1: minutes and seconds are exactly two digits 00-59, fraction exactly three digits.
  it.each(['1:23.456', '01:23.45', '01:23.4567', '01:60.000', '60:00.000', '1:00:00.000', '01:23,456'])('refuses %j', (text) => {
    expect(parseVttTimestamp(text).ok).toBe(false);
  });
});

describe('formatIsoDuration (ISO 8601; schema.org duration)', () => {
  it.each([
    // check-values.md: PT27M50S = 1670 s; minutes need the T designator (P10M is ten months).
    [1670, 'PT27M50S'],
    [600, 'PT10M'],
    [0, 'PT0S'],
    [3600, 'PT1H'],
    [3725.5, 'PT1H2M5.5S'],
  ])('%s s -> %s', (s, text) => expect(formatIsoDuration(s)).toBe(text));
});

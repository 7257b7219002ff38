/**
 * Caption files in and out. Out: a WebVTT file (W3C WebVTT, https://www.w3.org/TR/webvtt1/).
 * In: WebVTT, read by `webvtt-parser` (it follows the spec's parsing algorithm), or SubRip
 * (.srt), read by `srt-parser-2`. SubRip has no formal specification; its usual layout is
 * numbered blocks with `hh:mm:ss,mmm --> hh:mm:ss,mmm` lines (common practice).
 * Cues are stored as plain text: markup from a file (`<i>`, `<v Ada>`, SRT's `{\an8}`) is
 * dropped on the way in and `&`, `<`, `>` are escaped on the way out, so what a coach types in
 * the editor is exactly what members read.
 */
import SrtParser from 'srt-parser-2';
import webvtt from 'webvtt-parser';
import { formatVttTimestamp, roundToMillis } from '../time/format-time';
import { captionCuesSchema, type CaptionCue } from './caption-schema';

export type CaptionFileFormat = 'vtt' | 'srt';
export type CaptionFileResult = { ok: true; format: CaptionFileFormat; cues: CaptionCue[] } | { ok: false; message: string };

const escapeText = (t: string): string => t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

/** The captions as a WebVTT file: header, blank line, then one numbered cue per caption (§4.1). */
export function captionsToVtt(cues: readonly CaptionCue[]): string {
  const blocks = cues.map((c, i) => `${i + 1}\n${formatVttTimestamp(c.startSeconds)} --> ${formatVttTimestamp(c.endSeconds)}\n${escapeText(c.text)}`);
  return blocks.length ? `WEBVTT\n\n${blocks.join('\n\n')}\n` : 'WEBVTT\n';
}

const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', nbsp: '\u00a0', lrm: '\u200e', rlm: '\u200f' };

/** Cue text from a file as plain text: tags and SRT position codes dropped, character references read. */
function plainCueText(raw: string): string {
  return raw
    .replace(/\{\\[^}]*\}/g, '')
    .replace(/<[^>]*>/g, '')
    .replace(/&(amp|lt|gt|nbsp|lrm|rlm);/g, (_, name: string) => ENTITIES[name]!)
    .replace(/\r\n?/g, '\n')
    .split('\n')
    .map((line) => line.trim())
    .filter(Boolean)
    .join('\n');
}

/** The first block of an SRT file: a number, then a timing line with commas (or dots). */
const SRT_START = /^\uFEFF?\s*\d+[ \t]*\r?\n[ \t]*\d{1,2}:\d{2}:\d{2}[,.]\d{1,3}[ \t]*-->/;

/** Which format a file is in, from its first line(s); undefined when it is neither. */
export function captionFileFormat(text: string): CaptionFileFormat | undefined {
  if (/^\uFEFF?WEBVTT(?:[ \t]|\r|\n|$)/.test(text)) return 'vtt';
  if (SRT_START.test(text)) return 'srt';
  return undefined;
}

/**
 * Reads a caption file. A file with errors imports nothing: the first problem is named with its
 * line, so the coach can fix the file. The cue list is then checked by the save's own schema.
 */
export function captionsFromFile(text: string): CaptionFileResult {
  if (!text.trim()) return { ok: false, message: 'The file is empty. Choose a WebVTT (.vtt) or SubRip (.srt) caption file.' };
  const format = captionFileFormat(text);
  if (!format) {
    return { ok: false, message: 'This is not a caption file we can read: a WebVTT file starts with “WEBVTT”, a SubRip file with “1” and a timing line. Export the captions as .vtt or .srt and try again.' };
  }
  let raw: { startSeconds: number; endSeconds: number; text: string }[];
  if (format === 'vtt') {
    const parsed = new webvtt.WebVTTParser().parse(text, 'metadata');
    const first = parsed.errors[0];
    if (first) return { ok: false, message: `The WebVTT file has a problem on line ${first.line}: ${first.message.replace(/\.+$/, '')}. Nothing was imported.` };
    raw = parsed.cues.map((c) => ({ startSeconds: c.startTime, endSeconds: c.endTime, text: c.text }));
  } else {
    raw = new SrtParser().fromSrt(text).map((c) => ({ startSeconds: c.startSeconds, endSeconds: c.endSeconds, text: c.text }));
  }
  if (raw.length === 0) return { ok: false, message: 'The file has no captions (no timing lines were found). Nothing was imported.' };
  const cues = raw
    .map((c) => ({ startSeconds: roundToMillis(c.startSeconds), endSeconds: roundToMillis(c.endSeconds), text: plainCueText(c.text) }))
    .sort((a, b) => a.startSeconds - b.startSeconds || a.endSeconds - b.endSeconds);
  const checked = captionCuesSchema.safeParse(cues);
  if (!checked.success) {
    const issue = checked.error.issues[0]!;
    const index = typeof issue.path[0] === 'number' ? issue.path[0] : undefined;
    return { ok: false, message: `${index === undefined ? '' : `Caption ${index + 1} (at ${formatVttTimestamp(cues[index]!.startSeconds)}): `}${issue.message} Nothing was imported.` };
  }
  return { ok: true, format, cues: checked.data };
}

/**
 * Timeline to and from a WebVTT chapters file (W3C WebVTT, https://www.w3.org/TR/webvtt1/).
 *
 * How a segment is carried, so a round trip keeps everything:
 * - The chapter title text is what a player shows: the segment's `title`, or when it has
 *   none a label built from kind, exercise, round and set (`Work: Goblet squat, round 2`).
 *   It is plain title text: `&`, `<` and `>` are written as character references, so there
 *   are never tags (§4.2.3) and never `-->`.
 * - The cue identifier carries the data: the segment id, then space-separated `key=value`
 *   pairs with percent-encoded values: `kind`, `exercise`, `round`, `set`, `side`, `format`, and `label=auto`
 *   when the title text was generated (so no `title` is set on import). Segment ids never
 *   contain spaces or `-->`, and are unique, as §4.1 requires of cue identifiers.
 * - Coaching cues are not chapters (they are points, and a chapter needs an end after its
 *   start), so each travels in a comment block, which players ignore (§4.1):
 *   `NOTE cue id=… at=mm:ss.ttt kind=… text=…` (percent-encoded, so never `-->`).
 * A chapter file from elsewhere (no such identifier) still imports: the kind is read from
 * the title's first word when it names a segment kind (`Rest`, `Cool-down`…), else `talk`,
 * and the title text becomes the segment title.
 *
 * Chapters may nest but not partly overlap (§4.5.1): export refuses a timeline whose
 * segments partly overlap and says which, since the file would not be a valid chapter file.
 */
import { formatVttTimestamp, parseVttTimestamp } from '../time/format-time';
import { duplicateIdErrors, fillIds, importedTimeline, issueMessages, type ImportError, type ImportResult } from './timeline-import';
import { cueSchema, segmentSchema, timelineIdSchema, type Cue, type Segment, type SegmentKind, type Timeline } from './timeline-schema';

const KIND_LABELS: Record<SegmentKind, string> = {
  intro: 'Intro',
  warmup: 'Warm-up',
  work: 'Work',
  rest: 'Rest',
  'round-break': 'Round break',
  cooldown: 'Cool-down',
  outro: 'Outro',
  talk: 'Talk',
};

/** The chapter label used when a segment has no title, e.g. `Work: Goblet squat, round 2, set 1`. */
export function chapterLabel(s: Pick<Segment, 'kind' | 'exercise' | 'round' | 'set' | 'side'>): string {
  let label = KIND_LABELS[s.kind];
  if (s.exercise) label += `: ${s.exercise}`;
  const parts: string[] = [];
  if (s.side !== undefined) parts.push(`${s.side} side`);
  if (s.round !== undefined) parts.push(`round ${s.round}`);
  if (s.set !== undefined) parts.push(`set ${s.set}`);
  return parts.length > 0 ? `${label}${s.exercise ? ', ' : ' '}${parts.join(', ')}` : label;
}

const escapeText = (t: string): string => t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

function unescapeText(t: string): string {
  return t.replace(/&(amp|lt|gt|nbsp|lrm|rlm|#\d+|#x[0-9a-fA-F]+);/g, (_, ref: string) => {
    switch (ref) {
      case 'amp': return '&';
      case 'lt': return '<';
      case 'gt': return '>';
      case 'nbsp': return '\u00a0';
      case 'lrm': return '\u200e';
      case 'rlm': return '\u200f';
      default: return String.fromCodePoint(ref[1] === 'x' ? parseInt(ref.slice(2), 16) : Number(ref.slice(1)));
    }
  });
}

export type WebVttExport = { ok: true; text: string } | { ok: false; errors: { segmentId: string; message: string }[] };

/** Writes the timeline as a WebVTT chapters file (coaching cues in comment blocks unless `includeCues` is false). */
export function timelineToWebVtt(timeline: Timeline, options: { includeCues?: boolean } = {}): WebVttExport {
  const segments = [...timeline.segments].sort((a, b) => a.startSeconds - b.startSeconds || b.endSeconds - a.endSeconds);
  // Chapters nest or follow each other; check with a stack of open chapters.
  const errors: { segmentId: string; message: string }[] = [];
  const open: Segment[] = [];
  for (const s of segments) {
    while (open.length > 0 && open[open.length - 1]!.endSeconds <= s.startSeconds) open.pop();
    const parent = open[open.length - 1];
    if (parent && s.endSeconds > parent.endSeconds) {
      errors.push({ segmentId: s.id, message: `Segment "${s.id}" starts inside "${parent.id}" but ends after it; chapters may only nest. Fix the overlap first.` });
      continue;
    }
    open.push(s);
  }
  if (errors.length > 0) return { ok: false, errors };

  const blocks: string[] = ['WEBVTT'];
  for (const s of segments) {
    const keys = [`kind=${s.kind}`];
    if (s.exercise !== undefined) keys.push(`exercise=${encodeURIComponent(s.exercise)}`);
    if (s.round !== undefined) keys.push(`round=${s.round}`);
    if (s.set !== undefined) keys.push(`set=${s.set}`);
    if (s.side !== undefined) keys.push(`side=${s.side}`);
    if (s.format !== undefined) keys.push(`format=${s.format}`);
    if (s.title === undefined) keys.push('label=auto');
    const title = s.title ?? chapterLabel(s);
    blocks.push(`${s.id} ${keys.join(' ')}\n${formatVttTimestamp(s.startSeconds)} --> ${formatVttTimestamp(s.endSeconds)}\n${escapeText(title)}`);
  }
  if (options.includeCues !== false) {
    const cues = [...timeline.cues].sort((a, b) => a.atSeconds - b.atSeconds);
    for (const c of cues) {
      blocks.push(`NOTE cue id=${encodeURIComponent(c.id)} at=${formatVttTimestamp(c.atSeconds)} kind=${c.kind} text=${encodeURIComponent(c.text)}`);
    }
  }
  return { ok: true, text: blocks.join('\n\n') + '\n' };
}

interface Block {
  line: number;
  lines: string[];
}

/** Splits into blocks separated by blank lines, keeping the first line number of each. */
function splitBlocks(lines: readonly string[], from: number): Block[] {
  const blocks: Block[] = [];
  let current: Block | undefined;
  for (let i = from; i < lines.length; i++) {
    const l = lines[i]!;
    if (l === '') {
      current = undefined;
      continue;
    }
    if (!current) {
      current = { line: i + 1, lines: [] };
      blocks.push(current);
    }
    current.lines.push(l);
  }
  return blocks;
}

function readKeys(tokens: readonly string[]): Map<string, string> | undefined {
  const keys = new Map<string, string>();
  for (const t of tokens) {
    const eq = t.indexOf('=');
    if (eq <= 0) return undefined;
    try {
      keys.set(t.slice(0, eq), decodeURIComponent(t.slice(eq + 1)));
    } catch {
      return undefined;
    }
  }
  return keys;
}

const LABEL_KINDS = new Map<string, SegmentKind>(
  Object.entries(KIND_LABELS).map(([kind, label]) => [label.toLowerCase(), kind as SegmentKind]),
);

/** Kind from a foreign chapter title's first word(s), e.g. `Cool-down and stretch`. */
function kindFromTitle(title: string): SegmentKind {
  const lower = title.toLowerCase();
  for (const [label, kind] of LABEL_KINDS) {
    if (lower === label || lower.startsWith(`${label} `) || lower.startsWith(`${label}:`)) return kind;
  }
  return 'talk';
}

const TIMING = /^(\S+)[ \t]+-->[ \t]+(\S+)(?:[ \t]+.*)?$/;

/** Reads a timeline from a WebVTT chapters file. On any error nothing is imported. */
export function timelineFromWebVtt(text: string): ImportResult {
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = src.split(/\r\n|\r|\n/);
  const errors: ImportError[] = [];
  const first = lines[0] ?? '';
  if (!/^WEBVTT(?:[ \t].*)?$/.test(first)) {
    return { ok: false, errors: [{ line: 1, message: 'A WebVTT file must start with "WEBVTT" on the first line.' }] };
  }
  if (lines.length > 1 && lines[1] !== '') {
    return { ok: false, errors: [{ line: 2, message: 'Leave a blank line after the "WEBVTT" line.' }] };
  }
  const segments: (Segment & { line: number; generatedId: boolean })[] = [];
  const cues: (Omit<Cue, 'id'> & { id?: string; line: number })[] = [];
  let previousStart = -Infinity;
  for (const block of splitBlocks(lines, 1)) {
    const head = block.lines[0]!;
    const fail = (line: number, message: string): void => { errors.push({ line, message }); };
    if (/^NOTE(?:[ \t]|$)/.test(head)) {
      const body = head.slice(4).trim().split(/[ \t]+/);
      if (body[0] !== 'cue') continue; // an ordinary comment
      const keys = readKeys(body.slice(1));
      const atText = keys?.get('at');
      const at = atText === undefined ? undefined : parseVttTimestamp(atText);
      if (!keys || !at || !at.ok) {
        fail(block.line, 'This cue comment is damaged: it needs id=, at=mm:ss.ttt, kind= and text=.');
        continue;
      }
      const parsed = cueSchema.safeParse({ id: keys.get('id') ?? 'placeholder', atSeconds: at.seconds, kind: keys.get('kind'), text: keys.get('text') });
      if (!parsed.success) issueMessages(parsed.error).forEach((m) => fail(block.line, m));
      else cues.push({ ...parsed.data, id: keys.get('id'), line: block.line });
      continue;
    }
    if (/^(STYLE|REGION)(?:[ \t]|$)/.test(head) && !head.includes('-->')) continue;
    const hasId = !head.includes('-->');
    const timingIndex = hasId ? 1 : 0;
    const timing = block.lines[timingIndex];
    const timingLine = block.line + timingIndex;
    if (timing === undefined || !timing.includes('-->')) {
      fail(block.line, hasId ? 'A cue identifier must be followed by a timing line "start --> end" on the next line.' : 'Expected a timing line "start --> end".');
      continue;
    }
    const m = TIMING.exec(timing);
    if (!m) { fail(timingLine, 'The timing line must be "start --> end" with spaces around the arrow.'); continue; }
    const start = parseVttTimestamp(m[1]!);
    const end = parseVttTimestamp(m[2]!);
    if (!start.ok) { fail(timingLine, `Start: ${start.message}`); continue; }
    if (!end.ok) { fail(timingLine, `End: ${end.message}`); continue; }
    if (start.seconds < previousStart) fail(timingLine, 'This chapter starts before the previous one; chapters must be in time order.');
    previousStart = Math.max(previousStart, start.seconds);
    const titleLines = block.lines.slice(timingIndex + 1);
    if (titleLines.some((l) => l.includes('-->'))) { fail(timingLine + 1, 'A chapter title cannot contain "-->".'); continue; }
    if (titleLines.some((l) => /<[^>]*>/.test(l))) { fail(timingLine + 1, 'A chapter title is plain text: remove the tags (<…>).'); continue; }
    const titleText = unescapeText(titleLines.join(' ')).trim();
    if (titleText === '') { fail(timingLine, 'This chapter has no title. Add a title line under the timing line.'); continue; }

    const tokens = hasId ? head.trim().split(/[ \t]+/) : [];
    const keys = readKeys(tokens.slice(1));
    const ours = hasId && keys !== undefined && keys.has('kind') && timelineIdSchema.safeParse(tokens[0]).success;
    let candidate: Record<string, unknown>;
    if (ours) {
      const num = (k: string): number | string | undefined => {
        const v = keys!.get(k);
        return v === undefined ? undefined : /^\d+$/.test(v) ? Number(v) : v;
      };
      candidate = {
        id: tokens[0],
        kind: keys!.get('kind'),
        exercise: keys!.get('exercise'),
        round: num('round'),
        set: num('set'),
        side: keys!.get('side'),
        format: keys!.get('format'),
        title: keys!.get('label') === 'auto' ? undefined : titleText,
      };
    } else {
      const foreignId = hasId && timelineIdSchema.safeParse(head.trim()).success ? head.trim() : undefined;
      candidate = { id: foreignId ?? 'placeholder', kind: kindFromTitle(titleText), title: titleText };
    }
    const parsed = segmentSchema.safeParse({ ...candidate, startSeconds: start.seconds, endSeconds: end.seconds });
    if (!parsed.success) { issueMessages(parsed.error).forEach((msg) => fail(timingLine, msg)); continue; }
    segments.push({ ...parsed.data, line: timingLine, generatedId: candidate.id === 'placeholder' });
  }
  const segmentsWithIds = fillIds(segments.map(({ generatedId, ...s }) => (generatedId ? { ...s, id: '' } : s)), 'seg-');
  const cuesWithIds = fillIds(cues, 'cue-');
  errors.push(...duplicateIdErrors(segmentsWithIds, 'segment'), ...duplicateIdErrors(cuesWithIds, 'cue'));
  if (errors.length > 0) return { ok: false, errors: errors.sort((a, b) => a.line - b.line) };
  return importedTimeline({
    segments: segmentsWithIds.map(({ line: _line, ...s }) => s),
    cues: cuesWithIds.map(({ line: _line, ...c }) => c),
  });
}


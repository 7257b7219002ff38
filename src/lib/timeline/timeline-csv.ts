/**
 * Timeline to and from CSV.
 *
 * Format: a header row, then one row per segment or cue. Columns (any order, names without
 * case): `type` (`segment` or `cue`; when left out it follows from the kind, since segment
 * and cue kinds never share a name), `id` (optional on import; generated when blank),
 * `kind`, `start` (segment start or cue time), `end` (segments only), `exercise`, `round`,
 * `set`, `title`, `side` (`left`/`right`), `format` (`amrap`/`emom`) (segments), `text` (cues). Times are `m:ss.sss`, `h:mm:ss.sss` or plain
 * seconds; export writes `m:ss.sss` so every millisecond survives a round trip.
 */
import { formatPreciseTime, parseTime } from '../time/format-time';
import { readCsv, writeCsv } from './csv-records';
import { duplicateIdErrors, fillIds, importedTimeline, issueMessages, type ImportError, type ImportResult } from './timeline-import';
import { CUE_KINDS, SEGMENT_KINDS, cueSchema, segmentSchema, type Cue, type Segment, type Timeline } from './timeline-schema';

export const CSV_COLUMNS = ['type', 'id', 'kind', 'start', 'end', 'exercise', 'round', 'set', 'title', 'text', 'side', 'format'] as const;
type Column = (typeof CSV_COLUMNS)[number];

/** Writes the timeline as CSV: segments by start time, then cues by time. */
export function timelineToCsv(timeline: Timeline): string {
  const rows: string[][] = [[...CSV_COLUMNS]];
  const segments = [...timeline.segments].sort((a, b) => a.startSeconds - b.startSeconds || a.endSeconds - b.endSeconds);
  for (const s of segments) {
    rows.push(['segment', s.id, s.kind, formatPreciseTime(s.startSeconds), formatPreciseTime(s.endSeconds), s.exercise ?? '', s.round?.toString() ?? '', s.set?.toString() ?? '', s.title ?? '', '', s.side ?? '', s.format ?? '']);
  }
  const cues = [...timeline.cues].sort((a, b) => a.atSeconds - b.atSeconds);
  for (const c of cues) rows.push(['cue', c.id, c.kind, formatPreciseTime(c.atSeconds), '', '', '', '', '', c.text, '', '']);
  return writeCsv(rows);
}

const segmentKinds = new Set<string>(SEGMENT_KINDS);
const cueKinds = new Set<string>(CUE_KINDS);

/** Reads a timeline from CSV. On any error nothing is imported and every error names its line. */
export function timelineFromCsv(text: string): ImportResult {
  const read = readCsv(text);
  if (!read.ok) return read;
  const [header, ...rows] = read.records;
  if (!header) return { ok: false, errors: [{ line: 1, message: 'The file is empty. Start with a header row such as: ' + CSV_COLUMNS.join(',') }] };
  const errors: ImportError[] = [];
  const index = new Map<Column, number>();
  header.fields.forEach((name, i) => {
    const key = name.trim().toLowerCase() as Column;
    if (!(CSV_COLUMNS as readonly string[]).includes(key)) {
      errors.push({ line: header.line, message: `Unknown column "${name}". Columns are: ${CSV_COLUMNS.join(', ')}.` });
    } else if (index.has(key)) errors.push({ line: header.line, message: `The column "${key}" appears twice.` });
    else index.set(key, i);
  });
  for (const needed of ['kind', 'start'] as const) {
    if (!index.has(needed)) errors.push({ line: header.line, message: `The header has no "${needed}" column.` });
  }
  if (errors.length > 0) return { ok: false, errors };

  const segments: (Omit<Segment, 'id'> & { id?: string; line: number })[] = [];
  const cues: (Omit<Cue, 'id'> & { id?: string; line: number })[] = [];
  for (const row of rows) {
    const get = (c: Column): string => {
      const i = index.get(c);
      return i === undefined ? '' : (row.fields[i] ?? '').trim();
    };
    const fail = (message: string): void => { errors.push({ line: row.line, message }); };
    if (row.fields.length > header.fields.length) {
      fail(`This row has ${row.fields.length} fields but the header has ${header.fields.length}. Quote fields that contain commas.`);
      continue;
    }
    const kind = get('kind');
    let type = get('type').toLowerCase();
    if (type === '') type = segmentKinds.has(kind) ? 'segment' : cueKinds.has(kind) ? 'cue' : '';
    if (type !== 'segment' && type !== 'cue') {
      fail(type === '' ? `"${kind}" is not a segment or cue kind.` : `The type must be "segment" or "cue", not "${type}".`);
      continue;
    }
    const start = parseTime(get('start'));
    if (!start.ok) { fail(`Start: ${start.message}`); continue; }
    const id = get('id') || undefined;
    if (type === 'cue') {
      const parsed = cueSchema.safeParse({ id: id ?? 'placeholder', kind, atSeconds: start.seconds, text: get('text') });
      if (!parsed.success) { issueMessages(parsed.error).forEach(fail); continue; }
      cues.push({ ...parsed.data, id, line: row.line });
      continue;
    }
    const end = parseTime(get('end'));
    if (!end.ok) { fail(`End: ${end.message}`); continue; }
    const num = (c: 'round' | 'set'): number | undefined | string => {
      const v = get(c);
      if (v === '') return undefined;
      return /^\d+$/.test(v) ? Number(v) : v;
    };
    const candidate = {
      id: id ?? 'placeholder',
      kind,
      startSeconds: start.seconds,
      endSeconds: end.seconds,
      exercise: get('exercise') || undefined,
      round: num('round'),
      set: num('set'),
      title: get('title') || undefined,
      side: get('side').toLowerCase() || undefined,
      format: get('format').toLowerCase() || undefined,
    };
    const parsed = segmentSchema.safeParse(candidate);
    if (!parsed.success) { issueMessages(parsed.error).forEach(fail); continue; }
    segments.push({ ...parsed.data, id, line: row.line });
  }
  const withSegmentIds = fillIds(segments, 'seg-');
  const withCueIds = fillIds(cues, 'cue-');
  errors.push(...duplicateIdErrors(withSegmentIds, 'segment'), ...duplicateIdErrors(withCueIds, 'cue'));
  if (errors.length > 0) return { ok: false, errors: errors.sort((a, b) => a.line - b.line) };
  return importedTimeline({
    segments: withSegmentIds.map(({ line: _line, ...s }) => s),
    cues: withCueIds.map(({ line: _line, ...c }) => c),
  });
}


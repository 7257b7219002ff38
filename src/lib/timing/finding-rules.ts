/**
 * The timing check's rules that need no alignment: overlaps, gaps and the recording's end
 * (one sweep over sorted segments), lengths against the plan, cues (binary search over the
 * sorted segments, no cue × segment loop) and the advertised length.
 */
import type { Cue } from '../timeline/timeline-schema';
import { toMillis } from '../time/format-time';
import { compareWithAdvertised } from '../plan/advertised-length';
import { at, kindName, length, plannedName, segmentName, sentence } from './describe';
import type { Finding, FixChange } from './finding-types';
import { proposeGapFix, proposeMediaFix, proposeOverlapFix, proposeResize } from './propose-fix';
import type { TimelineView } from './timeline-view';

/** Attaches a fix (one change or several) when there is one. */
export const withFix = (finding: Finding, fix: FixChange[] | undefined): Finding => {
  if (fix && fix.length > 0) finding.fix = fix.length === 1 ? fix[0]! : fix;
  return finding;
};

/** `overlap`, `gap` and `outside-media` in one pass over the sorted segments. */
export function structureFindings(view: TimelineView): Finding[] {
  const out: Finding[] = [];
  const segs = view.segments;
  const gapTol = toMillis(view.tolerances.gapSeconds);
  for (let i = 1; i < segs.length; i++) {
    const b = segs[i]!;
    const h = view.holderBefore[i]!;
    const a = segs[h]!;
    const maxEnd = view.maxEndBefore[i]!;
    if (b.startSeconds < maxEnd) {
      const until = Math.min(maxEnd, b.endSeconds);
      out.push(withFix({
        code: 'overlap',
        severity: 'error',
        atSeconds: b.startSeconds,
        segmentIds: [a.id, b.id],
        message: `${sentence(segmentName(b))} overlaps ${segmentName(a)} from ${at(b.startSeconds)} to ${at(until)}. Move one of the two boundaries so they meet.`,
      }, proposeOverlapFix(view, h, i)));
    } else if (toMillis(b.startSeconds) - toMillis(maxEnd) > gapTol) {
      out.push(withFix({
        code: 'gap',
        severity: 'warning',
        atSeconds: maxEnd,
        segmentIds: [a.id, b.id],
        message: `${length(b.startSeconds - maxEnd)} between ${at(maxEnd)} and ${at(b.startSeconds)} is not marked. Extend a neighbouring segment or mark what happens there.`,
      }, proposeGapFix(view, h, i)));
    }
  }
  if (Number.isFinite(view.mediaSeconds)) {
    const media = toMillis(view.mediaSeconds);
    segs.forEach((s, i) => {
      if (toMillis(s.endSeconds) <= media) return;
      out.push(withFix({
        code: 'outside-media',
        severity: 'error',
        atSeconds: s.startSeconds,
        segmentIds: [s.id],
        message: `${sentence(segmentName(s))} ends at ${at(s.endSeconds)}, after the recording ends at ${at(view.mediaSeconds)}. End it within the recording.`,
      }, proposeMediaFix(view, i)));
    });
  }
  return out;
}

/** `work-too-*`, `rest-too-*` and `block-length` for every segment the plan accounts for. */
export function lengthFindings(view: TimelineView): Finding[] {
  const out: Finding[] = [];
  view.segments.forEach((s, i) => {
    const exp = view.expected.get(s.id);
    if (!exp) return;
    const marked = s.endSeconds - s.startSeconds;
    const diff = toMillis(marked) - toMillis(exp.seconds);
    if (Math.abs(diff) <= toMillis(exp.tolerance)) return;
    const long = diff > 0;
    const code =
      s.kind === 'work'
        ? long ? 'work-too-long' : 'work-too-short'
        : s.kind === 'rest' || s.kind === 'round-break'
          ? long ? 'rest-too-long' : 'rest-too-short'
          : 'block-length';
    // The planned length when the neighbours have room for it; else the nearest length the
    // tolerance allows (a squeezed mark at the class's end often has room for that only).
    const exact = proposeResize(view, i, exp.seconds);
    const edge = (toMillis(exp.seconds) + (long ? 1 : -1) * toMillis(exp.tolerance)) / 1000;
    const nearest = exact || !Number.isFinite(exp.tolerance) || edge <= 0 ? undefined : proposeResize(view, i, edge);
    const fix = exact ?? nearest;
    const action = exact
      ? `The suggested fix makes it ${length(exp.seconds)}.`
      : nearest
        ? `The suggested fix makes it ${length(edge)}, the nearest the neighbouring marks allow within the tolerance.`
        : `Move its ${long ? 'end earlier' : 'start earlier or its end later'} to make it ${length(exp.seconds)}.`;
    out.push(withFix({
      code,
      severity: s.kind === 'work' ? 'error' : 'warning',
      atSeconds: s.startSeconds,
      segmentIds: [s.id],
      message: `${sentence(segmentName(s))} lasts ${length(marked)}; the plan has ${length(exp.seconds)} for ${plannedName(exp.planned)} (±${length(exp.tolerance)}). ${action}`,
    }, fix));
  });
  return out;
}

/** Index of the last element with start <= t in an ascending array, or -1. */
function lastAtOrBefore(starts: Float64Array, t: number): number {
  let lo = 0;
  let hi = starts.length - 1;
  let found = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (starts[mid]! <= t) {
      found = mid;
      lo = mid + 1;
    } else hi = mid - 1;
  }
  return found;
}

/**
 * `cue-outside-segment` (a cue in unmarked time) and `countdown-late`: a countdown inside a
 * work interval and nearer its start than its end was meant to lead into it, so it came
 * too late (a countdown in the second half counts down the end of work, which is fine).
 */
export function cueFindings(view: TimelineView, cues: readonly Cue[]): Finding[] {
  const out: Finding[] = [];
  const segs = view.segments;
  const starts = new Float64Array(segs.length);
  segs.forEach((s, i) => { starts[i] = s.startSeconds; });
  // Work intervals on their own, with a running max end (work intervals may overlap).
  const work = segs.filter((s) => s.kind === 'work');
  const workStarts = new Float64Array(work.length);
  work.forEach((s, i) => { workStarts[i] = s.startSeconds; });

  for (const cue of cues) {
    const t = cue.atSeconds;
    const i = lastAtOrBefore(starts, t);
    // Covered when some segment starting at or before t ends at or after it.
    const covered = i >= 0 && Math.max(view.maxEndBefore[i]!, segs[i]!.endSeconds) >= t;
    if (!covered) {
      out.push({
        code: 'cue-outside-segment',
        severity: 'warning',
        atSeconds: t,
        segmentIds: [],
        cueIds: [cue.id],
        message: `The ${cue.kind} cue "${cue.text}" at ${at(t)} is not inside any marked segment. Move it into the segment it belongs to.`,
      });
      continue;
    }
    if (cue.kind !== 'countdown') continue;
    const w = lastAtOrBefore(workStarts, t);
    const seg = work[w];
    if (!seg || t <= seg.startSeconds || t >= seg.endSeconds) continue;
    if (t - seg.startSeconds < seg.endSeconds - t) {
      out.push({
        code: 'countdown-late',
        severity: 'warning',
        atSeconds: t,
        segmentIds: [seg.id],
        cueIds: [cue.id],
        message: `The countdown "${cue.text}" at ${at(t)} comes ${length(t - seg.startSeconds)} after ${segmentName(seg)} began. Move it before ${at(seg.startSeconds)} so it leads into the ${kindName(seg.kind)}.`,
      });
    }
  }
  return out;
}

/** `length-vs-advertised`: class length against the advertised minutes ± the house percentage. */
export function advertisedFinding(
  view: TimelineView,
  classSeconds: number,
  fromPlan: boolean,
  advertisedMinutes: number | null | undefined,
): Finding | undefined {
  const comparison = compareWithAdvertised(classSeconds, advertisedMinutes, view.tolerances.advertisedPercent);
  if (!comparison || comparison.within) return undefined;
  const what = fromPlan ? 'The plan adds up to' : 'The marked class runs';
  const first = view.segments[0];
  return {
    code: 'length-vs-advertised',
    severity: 'warning',
    atSeconds: first ? first.startSeconds : 0,
    segmentIds: [],
    message: `${what} ${length(classSeconds)}, but it is advertised as ${advertisedMinutes} minutes (±${view.tolerances.advertisedPercent} %). Change the advertised length to about ${Math.max(1, Math.round(classSeconds / 60))} minutes, or check the marks.`,
  };
}

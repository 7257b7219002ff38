/**
 * The EMOM rule: every minute's work starts at the top of the minute, and the block ends when
 * its last minute does (fitness trade, common practice, no source: "N minutes = N rounds; work
 * starts on each whole minute"). How long members work is what the coach marks, so lengths are
 * not checked; the minute boundaries are.
 */
import type { PlannedSegment } from '../plan/expand-plan';
import type { Plan } from '../plan/plan-schema';
import { toMillis } from '../time/format-time';
import { at, length } from './describe';
import type { Finding } from './finding-types';
import { withFix } from './finding-rules';
import { proposeEndAt, proposeStartAt } from './propose-fix';
import type { TimelineView } from './timeline-view';

interface MarkedMinute {
  pos: number;
  minute: number;
  exercise: string | undefined;
}

/**
 * Where minute 1 of the block began. Every marked minute proposes an origin ("its start − 60 s
 * × (minute − 1)"); the one most other minutes agree with (within the work tolerance) wins, and
 * among equals the one nearest the median, so one late minute is reported instead of shifting
 * all the others. Among the best agreed origins, one the marks can be moved onto (not a top
 * before the recording, or past a neighbour) is preferred, so the start findings come with a
 * fix; when none can, a minute may be reported without a fix rather than all the others.
 */
function blockOrigin(
  view: TimelineView,
  marked: readonly MarkedMinute[],
  workTol: number,
): number {
  const origins = marked.map((m) => toMillis(view.segments[m.pos]!.startSeconds) - 60_000 * (m.minute - 1));
  const agreeing = (o: number) => origins.filter((x) => Math.abs(x - o) <= workTol).length;
  const median = [...origins].sort((a, b) => a - b)[(origins.length - 1) >> 1]!;
  // Most agreement first; among equals the one nearest the median, then the earliest minute.
  const ranked = origins
    .map((o, k) => ({ o, k, n: agreeing(o) }))
    .sort((a, b) => b.n - a.n || Math.abs(a.o - median) - Math.abs(b.o - median) || a.k - b.k);
  const movable = (o: number) =>
    marked.every((m) => {
      const s = view.segments[m.pos]!;
      const top = o + 60_000 * (m.minute - 1);
      return Math.abs(toMillis(s.startSeconds) - top) <= workTol || proposeStartAt(view, m.pos, top / 1000) !== undefined;
    });
  // Only origins as well agreed as the best are candidates: passing to a less agreed one because
  // a fix is missing would report more minutes than are off, and the next round could flip back.
  const best = ranked.filter((c) => c.n === ranked[0]!.n);
  return (best.find((c) => movable(c.o)) ?? best[0]!).o;
}

/** `emom-minute` findings for every EMOM block with matched work marks. */
export function emomFindings(plan: Plan, view: TimelineView, workPlanned: ReadonlyMap<string, PlannedSegment>): Finding[] {
  const out: Finding[] = [];
  const workTol = toMillis(plan.tolerances.workSeconds);
  const restTol = toMillis(plan.tolerances.restSeconds);
  const gapTol = toMillis(plan.tolerances.gapSeconds);
  plan.blocks.forEach((block, blockIndex) => {
    if (block.kind !== 'emom') return;
    const marked: MarkedMinute[] = [];
    for (const [id, p] of workPlanned) {
      if (p.blockIndex !== blockIndex || p.round === undefined) continue;
      const pos = view.position.get(id);
      if (pos !== undefined) marked.push({ pos, minute: p.round, exercise: p.exercise });
    }
    if (marked.length === 0) return;
    marked.sort((a, b) => a.pos - b.pos);
    const origin = blockOrigin(view, marked, workTol);
    const name = `the EMOM (block ${blockIndex + 1})`;

    for (const m of marked) {
      const s = view.segments[m.pos]!;
      const top = origin + 60_000 * (m.minute - 1);
      const off = toMillis(s.startSeconds) - top;
      if (Math.abs(off) <= workTol) continue;
      out.push(withFix({
        code: 'emom-minute',
        severity: 'error',
        atSeconds: s.startSeconds,
        segmentIds: [s.id],
        message: `Minute ${m.minute} of ${block.minutes} of ${name}${m.exercise ? `, ${m.exercise},` : ''} starts at ${at(s.startSeconds)}, ${length(Math.abs(off) / 1000)} ${off > 0 ? 'after' : 'before'} the top of the minute at ${at(top / 1000)}. Move its start to ${at(top / 1000)}.`,
      }, proposeStartAt(view, m.pos, top / 1000)));
    }

    // The end: the last minute's work and the rests marked right after it.
    const last = marked[marked.length - 1]!;
    if (last.minute !== block.minutes) return;
    let endPos = last.pos;
    for (let k = last.pos + 1; k < view.segments.length; k++) {
      const s = view.segments[k]!;
      if (s.kind !== 'rest' || toMillis(s.startSeconds) - toMillis(view.segments[endPos]!.endSeconds) > gapTol) break;
      endPos = k;
    }
    const endSeg = view.segments[endPos]!;
    const due = origin + 60_000 * block.minutes;
    const off = toMillis(endSeg.endSeconds) - due;
    if (Math.abs(off) <= restTol) return;
    out.push(withFix({
      code: 'emom-minute',
      severity: 'warning',
      atSeconds: endSeg.endSeconds,
      segmentIds: [endSeg.id],
      message: `${name.charAt(0).toUpperCase()}${name.slice(1)} should end at ${at(due / 1000)}, ${block.minutes} minutes after its first minute began, but its last minute ends at ${at(endSeg.endSeconds)} (${length(Math.abs(off) / 1000)} ${off > 0 ? 'late' : 'early'}). Move the end to ${at(due / 1000)}.`,
    }, proposeEndAt(view, endPos, due / 1000)));
  });
  return out;
}

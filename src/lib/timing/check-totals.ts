/**
 * Totals of the timing check: marked against planned time per kind, per block and per
 * round (per set for intervals), and the class length against the advertised length.
 * A marked segment counts toward a block or round through what the plan matching made of
 * it; unmatched segments count only toward the per-kind totals.
 */
import type { ExpectedSchedule, PlannedSegment } from '../plan/expand-plan';
import type { Plan } from '../plan/plan-schema';
import { roundToMillis } from '../time/format-time';
import type { BlockTotals, CheckTotals, RoundTotals } from './finding-types';
import type { TimelineView } from './timeline-view';

function roundOf(p: PlannedSegment): number {
  return p.round ?? p.set ?? 1;
}

/** Computes the totals; `classSeconds` is the marked class length (first start to last end). */
export function checkTotals(
  plan: Plan,
  schedule: ExpectedSchedule,
  view: TimelineView,
  advertisedMinutes: number | null | undefined,
): CheckTotals {
  const blocks: BlockTotals[] = plan.blocks.map((b, blockIndex) => ({
    blockIndex,
    kind: b.kind,
    plannedSeconds: 0,
    markedSeconds: 0,
    plannedWorkSeconds: 0,
    markedWorkSeconds: 0,
    plannedRestSeconds: 0,
    markedRestSeconds: 0,
    rounds: [],
  }));
  const roundMap = new Map<string, RoundTotals>();
  const roundFor = (p: PlannedSegment): RoundTotals | undefined => {
    if (p.blockKind !== 'circuit' && p.blockKind !== 'intervals' && p.blockKind !== 'emom') return undefined;
    const key = `${p.blockIndex}:${roundOf(p)}`;
    let r = roundMap.get(key);
    if (!r) {
      r = { round: roundOf(p), plannedWorkSeconds: 0, markedWorkSeconds: 0, plannedRestSeconds: 0, markedRestSeconds: 0 };
      roundMap.set(key, r);
      blocks[p.blockIndex]!.rounds.push(r);
    }
    return r;
  };
  const add = (p: PlannedSegment, seconds: number, side: 'planned' | 'marked'): void => {
    const block = blocks[p.blockIndex]!;
    const round = roundFor(p);
    const isWork = p.kind === 'work';
    const isRest = p.kind === 'rest' || p.kind === 'round-break';
    if (side === 'planned') {
      block.plannedSeconds += seconds;
      if (isWork) block.plannedWorkSeconds += seconds;
      if (isRest) block.plannedRestSeconds += seconds;
      if (round && isWork) round.plannedWorkSeconds += seconds;
      if (round && isRest) round.plannedRestSeconds += seconds;
    } else {
      block.markedSeconds += seconds;
      if (isWork) block.markedWorkSeconds += seconds;
      if (isRest) block.markedRestSeconds += seconds;
      if (round && isWork) round.markedWorkSeconds += seconds;
      if (round && isRest) round.markedRestSeconds += seconds;
    }
  };
  for (const p of schedule.segments) add(p, p.seconds, 'planned');

  const marked = {
    workSeconds: 0,
    restSeconds: 0,
    roundBreakSeconds: 0,
    warmupSeconds: 0,
    cooldownSeconds: 0,
    talkSeconds: 0,
    introSeconds: 0,
    outroSeconds: 0,
    classSeconds: 0,
  };
  const segs = view.segments;
  for (const s of segs) {
    const len = s.endSeconds - s.startSeconds;
    switch (s.kind) {
      case 'work': marked.workSeconds += len; break;
      case 'rest': marked.restSeconds += len; break;
      case 'round-break': marked.roundBreakSeconds += len; break;
      case 'warmup': marked.warmupSeconds += len; break;
      case 'cooldown': marked.cooldownSeconds += len; break;
      case 'talk': marked.talkSeconds += len; break;
      case 'intro': marked.introSeconds += len; break;
      case 'outro': marked.outroSeconds += len; break;
    }
    const exp = view.expected.get(s.id);
    if (exp) add(exp.planned, len, 'marked');
  }
  const first = segs[0];
  marked.classSeconds = first ? view.maxEndBefore[segs.length]! - first.startSeconds : 0;

  // Sums of many float lengths: report them at the stored precision.
  for (const key of Object.keys(marked) as (keyof typeof marked)[]) marked[key] = roundToMillis(marked[key]);
  for (const b of blocks) {
    b.markedSeconds = roundToMillis(b.markedSeconds);
    b.markedWorkSeconds = roundToMillis(b.markedWorkSeconds);
    b.markedRestSeconds = roundToMillis(b.markedRestSeconds);
    for (const r of b.rounds) {
      r.markedWorkSeconds = roundToMillis(r.markedWorkSeconds);
      r.markedRestSeconds = roundToMillis(r.markedRestSeconds);
    }
    b.rounds.sort((x, y) => x.round - y.round);
  }

  const advertisedSeconds = advertisedMinutes && advertisedMinutes > 0 ? advertisedMinutes * 60 : null;
  const classSeconds = segs.length > 0 ? marked.classSeconds : schedule.totals.classSeconds;
  return {
    planned: { ...schedule.totals },
    marked,
    blocks,
    advertisedSeconds,
    classVsAdvertisedSeconds: advertisedSeconds === null ? null : roundToMillis(classSeconds - advertisedSeconds),
    mediaSeconds: Number.isFinite(view.mediaSeconds) ? view.mediaSeconds : null,
  };
}

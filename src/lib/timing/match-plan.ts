/**
 * Matches marked segments to the expected schedule: work by sequence alignment, the rests
 * and round breaks that follow each matched work interval by kind, and warm-up, cool-down
 * and talk blocks by their order. Fills `view.expected` and reports the station findings
 * (`missing-station`, `unexpected-station`, `out-of-order`, `round-count`) and `block-length`
 * findings for blocks that are missing or not in the plan.
 */
import { markFieldsOf, type ExpectedSchedule, type PlannedSegment } from '../plan/expand-plan';
import type { Plan, PlanBlock } from '../plan/plan-schema';
import type { Segment } from '../timeline/timeline-schema';
import { toMillis } from '../time/format-time';
import { alignStations, normaliseExercise, type AlignItem } from './align-stations';
import { at, kindName, length, plannedName, plannedPlace, segmentName, sentence } from './describe';
import type { Finding } from './finding-types';
import type { TimelineView } from './timeline-view';

export interface PlanMatch {
  /** Marked work segment id -> planned work it stands for (matched, moved or renamed). */
  workPlanned: Map<string, PlannedSegment>;
  findings: Finding[];
}

/** Stands for an AMRAP span in alignment: no exercise name can hold a control character. */
const AMRAP_NAME = '\u0000amrap';

/**
 * The name a work interval is aligned by: an AMRAP span by its format, any other by its
 * exercise and, for a station done per side, its side (so left and right are matched one by
 * one). A mark without an exercise name has none and matches anything.
 */
function alignName(w: Pick<Segment, 'exercise' | 'side' | 'format'>): string | null {
  if (w.format === 'amrap') return AMRAP_NAME;
  const name = normaliseExercise(w.exercise);
  return name !== null && w.side ? `${name}\u0000${w.side}` : name;
}

/**
 * The length a mark is held to. EMOM work is what the coach marks and its rest is what is left
 * of the minute, so neither has a length of its own: the minute boundaries are checked instead
 * (`emomFindings`), and an infinite tolerance keeps the length rules and fixes off them.
 */
function toleranceFor(plan: Plan, planned: PlannedSegment): number {
  if (planned.blockKind === 'emom') return Infinity;
  const kind = planned.kind;
  if (kind === 'work') return plan.tolerances.workSeconds;
  if (kind === 'rest' || kind === 'round-break') return plan.tolerances.restSeconds;
  return plan.tolerances.blockSeconds;
}

/** How a block's work is counted when some of it is not marked. */
interface CountedUnits {
  /** Rounds, sets or minutes the plan has. */
  unitsPlanned: number;
  /** Work intervals in one unit when none is left out (for extra marks). */
  unitSize: number;
  unit: 'round' | 'set' | 'minute';
  name: string;
  /** Missing-work keys of the block, and how many units a key counts when all of its work is missing (0: never whole). */
  keys: string[];
  unitsPerKey: number;
}

/**
 * Circuits count rounds (a round has one work per station, two per station done per side),
 * intervals count sets (two work spans a set when done per side), an EMOM counts minutes; an AMRAP is one span, so a missing one is
 * reported like a missing station. Warm-up, cool-down and talk are matched elsewhere.
 */
function countedUnits(block: PlanBlock, blockIndex: number): CountedUnits | undefined {
  const perRound = (rounds: number) => Array.from({ length: rounds }, (_, r) => `${blockIndex}:${r + 1}`);
  switch (block.kind) {
    case 'circuit':
      return {
        unitsPlanned: block.rounds,
        unitSize: block.stations.reduce((n, st) => n + (st.perSide ? 2 : 1), 0),
        unit: 'round',
        name: `circuit (block ${blockIndex + 1})`,
        keys: perRound(block.rounds),
        unitsPerKey: 1,
      };
    case 'emom':
      return { unitsPlanned: block.minutes, unitSize: 1, unit: 'minute', name: `EMOM (block ${blockIndex + 1})`, keys: perRound(block.minutes), unitsPerKey: 1 };
    case 'intervals':
      return { unitsPlanned: block.sets, unitSize: block.sets * (block.perSide === true ? 2 : 1), unit: 'set', name: `${block.exercise} intervals (block ${blockIndex + 1})`, keys: [`${blockIndex}:sets`], unitsPerKey: block.sets };
    case 'amrap':
      return { unitsPlanned: 1, unitSize: 1, unit: 'set', name: `AMRAP (block ${blockIndex + 1})`, keys: [`${blockIndex}:sets`], unitsPerKey: 0 };
    default:
      return undefined;
  }
}

/** Matches the plan to the marks; see the module comment. */
export function matchPlan(plan: Plan, schedule: ExpectedSchedule, view: TimelineView): PlanMatch {
  const findings: Finding[] = [];
  const segs = view.segments;
  const expect = (segment: Segment, planned: PlannedSegment): void => {
    const pinnedStart = planned.blockKind === 'emom' && planned.kind === 'work';
    view.expected.set(segment.id, { planned, seconds: planned.seconds, tolerance: toleranceFor(plan, planned), ...(pinnedStart ? { pinnedStart } : {}) });
  };

  // Class start: first marked segment that is not an intro (intros are not in the plan).
  const firstMarked = segs.find((s) => s.kind !== 'intro') ?? segs[0];
  const origin = firstMarked ? firstMarked.startSeconds : 0;

  const plannedWork = schedule.segments.filter((p) => p.kind === 'work');
  const markedWorkPos: number[] = [];
  segs.forEach((s, i) => { if (s.kind === 'work') markedWorkPos.push(i); });
  const plannedItems: AlignItem[] = plannedWork.map((p) => ({ name: alignName(p), relativeStart: p.startSeconds - schedule.startSeconds }));
  const markedItems: AlignItem[] = markedWorkPos.map((pos) => {
    const s = segs[pos]!;
    return { name: alignName(s), relativeStart: s.startSeconds - origin };
  });
  const steps = alignStations(plannedItems, markedItems);

  const workPlanned = new Map<string, PlannedSegment>();
  const plannedUsed = new Uint8Array(plannedWork.length);
  /** For each unmatched planned work: the marked index it would have come before (region anchor). */
  const unmatchedPlanned: { p: number; nextMarked: number; region: number }[] = [];
  const unmatchedMarked: { m: number; region: number; prevPlanned: number }[] = [];
  let region = 0;
  let lastPlanned = -1;
  for (const step of steps) {
    if (step.planned >= 0 && step.marked >= 0) {
      region++;
      plannedUsed[step.planned] = 1;
      lastPlanned = step.planned;
      workPlanned.set(segs[markedWorkPos[step.marked]!]!.id, plannedWork[step.planned]!);
    } else if (step.planned >= 0) {
      unmatchedPlanned.push({ p: step.planned, nextMarked: -1, region });
    } else {
      unmatchedMarked.push({ m: step.marked, region, prevPlanned: lastPlanned });
    }
  }
  // Where a missing station would have been: the next marked work after it.
  {
    let k = unmatchedPlanned.length - 1;
    let nextMarked = -1;
    for (let s = steps.length - 1; s >= 0 && k >= 0; s--) {
      const step = steps[s]!;
      if (step.marked >= 0) nextMarked = step.marked;
      else if (step.planned === unmatchedPlanned[k]!.p) unmatchedPlanned[k--]!.nextMarked = nextMarked;
    }
  }

  // A named mark whose exercise is planned elsewhere (and not marked there) is out of order.
  const openByName = new Map<string, number[]>();
  for (const u of unmatchedPlanned) {
    const name = plannedItems[u.p]!.name;
    if (name === null) continue;
    const list = openByName.get(name);
    if (list) list.push(u.p); else openByName.set(name, [u.p]);
  }
  const pairedPlanned = new Set<number>();
  const remainingMarked: typeof unmatchedMarked = [];
  for (const u of unmatchedMarked) {
    const name = markedItems[u.m]!.name;
    const options = name === null ? undefined : openByName.get(name)?.filter((p) => !pairedPlanned.has(p));
    if (!options || options.length === 0) {
      remainingMarked.push(u);
      continue;
    }
    // Nearest planned position to where the mark sits.
    let best = options[0]!;
    for (const p of options) if (Math.abs(p - u.prevPlanned) < Math.abs(best - u.prevPlanned)) best = p;
    pairedPlanned.add(best);
    const segment = segs[markedWorkPos[u.m]!]!;
    const planned = plannedWork[best]!;
    workPlanned.set(segment.id, planned);
    findings.push({
      code: 'out-of-order',
      severity: 'warning',
      atSeconds: segment.startSeconds,
      segmentIds: [segment.id],
      message: `${sentence(segmentName(segment))} is out of order: the plan has ${plannedName(planned)} elsewhere. Check the order of the marks or of the plan.`,
    });
  }

  // A renamed station: an unplanned mark in the same place as an unmarked station.
  const openPlannedByRegion = new Map<number, number[]>();
  for (const u of unmatchedPlanned) {
    if (pairedPlanned.has(u.p)) continue;
    const list = openPlannedByRegion.get(u.region);
    if (list) list.push(u.p); else openPlannedByRegion.set(u.region, [u.p]);
  }
  const extraPerBlock = new Map<number, number>();
  for (const u of remainingMarked) {
    const segment = segs[markedWorkPos[u.m]!]!;
    const open = openPlannedByRegion.get(u.region);
    const p = open?.shift();
    if (p !== undefined) {
      pairedPlanned.add(p);
      const planned = plannedWork[p]!;
      workPlanned.set(segment.id, planned);
      findings.push({
        code: 'unexpected-station',
        severity: 'warning',
        atSeconds: segment.startSeconds,
        segmentIds: [segment.id],
        message: `${sentence(segmentName(segment))} is not what the plan has here: it expects ${plannedName(planned)}. Rename the mark or update the plan.`,
      });
      continue;
    }
    const near = plannedWork[u.prevPlanned] ?? plannedWork[0];
    if (near) extraPerBlock.set(near.blockIndex, (extraPerBlock.get(near.blockIndex) ?? 0) + 1);
    findings.push({
      code: 'unexpected-station',
      severity: 'warning',
      atSeconds: segment.startSeconds,
      segmentIds: [segment.id],
      message: `${sentence(segmentName(segment))} is not in the plan. Remove the mark, or add the station to the plan.`,
    });
  }

  // Unmarked stations: whole missing rounds (or a whole missing block) become one round-count finding.
  const missing = unmatchedPlanned.filter((u) => !pairedPlanned.has(u.p));
  const missingByRound = new Map<string, typeof missing>();
  for (const u of missing) {
    const p = plannedWork[u.p]!;
    const key = p.round !== undefined ? `${p.blockIndex}:${p.round}` : `${p.blockIndex}:sets`;
    const list = missingByRound.get(key);
    if (list) list.push(u); else missingByRound.set(key, [u]);
  }
  const lastMarkedEnd = segs.length > 0 ? view.maxEndBefore[segs.length]! : schedule.startSeconds;
  // Where a missing station belongs: after the previous marked work and its rests, else
  // before the next marked work.
  const anchorTime = (u: { nextMarked: number; p: number }): number => {
    const nextPos = u.nextMarked >= 0 ? markedWorkPos[u.nextMarked]! : segs.length;
    const prevPos = u.nextMarked >= 0 ? markedWorkPos[u.nextMarked - 1] : markedWorkPos[markedWorkPos.length - 1];
    if (prevPos !== undefined) {
      let end = segs[prevPos]!.endSeconds;
      for (let k = prevPos + 1; k < nextPos; k++) {
        const s = segs[k]!;
        if ((s.kind !== 'rest' && s.kind !== 'round-break') || s.startSeconds > end + plan.tolerances.gapSeconds) break;
        end = Math.max(end, s.endSeconds);
      }
      return end;
    }
    if (u.nextMarked >= 0) return segs[nextPos]!.startSeconds;
    return segs.length > 0 ? lastMarkedEnd : plannedWork[u.p]!.startSeconds;
  };
  plan.blocks.forEach((block, blockIndex) => {
    const counted = countedUnits(block, blockIndex);
    if (!counted) return;
    const { unitsPlanned, unitSize, unit, name, keys, unitsPerKey } = counted;
    // Planned work per round (a round may leave stations out), or all sets of an intervals block.
    const plannedPerKey = new Map<string, number>();
    for (const p of plannedWork) {
      if (p.blockIndex !== blockIndex) continue;
      const key = p.round !== undefined ? `${p.blockIndex}:${p.round}` : `${p.blockIndex}:sets`;
      plannedPerKey.set(key, (plannedPerKey.get(key) ?? 0) + 1);
    }
    let wholeMissing = 0;
    let firstMissingAt = Infinity;
    const partial: typeof missing = [];
    for (const key of keys) {
      const list = missingByRound.get(key) ?? [];
      if (unitsPerKey > 0 && list.length === (plannedPerKey.get(key) ?? unitSize) && list.length > 0) {
        wholeMissing += unitsPerKey;
        firstMissingAt = Math.min(firstMissingAt, anchorTime(list[0]!));
      } else partial.push(...list);
    }
    const extraUnits = unit === 'set' ? 0 : Math.floor((extraPerBlock.get(blockIndex) ?? 0) / unitSize);
    if (wholeMissing > 0) {
      const marked = unitsPlanned - wholeMissing;
      findings.push({
        code: 'round-count',
        severity: 'error',
        atSeconds: Number.isFinite(firstMissingAt) ? firstMissingAt : 0,
        segmentIds: [],
        message: `The plan has ${unitsPlanned} ${unit}s of the ${name}, but only ${marked} ${marked === 1 ? 'is' : 'are'} marked. Mark the missing ${unit}s or change the plan.`,
      });
    } else if (extraUnits > 0) {
      findings.push({
        code: 'round-count',
        severity: 'error',
        atSeconds: lastMarkedEnd,
        segmentIds: [],
        message: `The marks hold ${unitsPlanned + extraUnits} ${unit}s of the ${name}, but the plan has ${unitsPlanned}. Remove the extra marks or change the plan.`,
      });
    }
    for (const u of partial) {
      const p = plannedWork[u.p]!;
      findings.push({
        code: 'missing-station',
        severity: 'error',
        atSeconds: anchorTime(u),
        segmentIds: [],
        message: `${sentence(plannedName(p))} is not marked; it should come around ${at(anchorTime(u))}. Mark its work interval.`,
        missing: {
          blockIndex: p.blockIndex,
          ...(p.stationIndex !== undefined ? { stationIndex: p.stationIndex } : {}),
          ...markFieldsOf(p),
          seconds: p.seconds,
        },
      });
    }
  });

  // Rests and round breaks: the non-work segments right after each matched work interval.
  const coveredPlanned = new Set<number>();
  for (const p of workPlanned.values()) coveredPlanned.add(p.index);
  for (const pos of markedWorkPos) {
    const work = segs[pos]!;
    const planned = workPlanned.get(work.id);
    if (!planned) continue;
    expect(work, planned);
    const plannedChain: PlannedSegment[] = [];
    for (let k = planned.index + 1; k < schedule.segments.length; k++) {
      const p = schedule.segments[k]!;
      if (p.kind !== 'rest' && p.kind !== 'round-break') break;
      plannedChain.push(p);
    }
    const used = new Array<boolean>(plannedChain.length).fill(false);
    let end = work.endSeconds;
    let foundRest = false;
    for (let k = pos + 1; k < segs.length; k++) {
      const s = segs[k]!;
      if (s.kind !== 'rest' && s.kind !== 'round-break') break;
      // Once every planned rest here is taken, a reportable gap ends the chain: a rest after
      // it belongs to something unmarked (a missing station), not to this work interval.
      const afterGap = toMillis(s.startSeconds) - toMillis(end) > toMillis(plan.tolerances.gapSeconds);
      if (afterGap && used.every(Boolean)) break;
      foundRest = true;
      end = s.endSeconds;
      let slot = plannedChain.findIndex((p, idx) => !used[idx] && p.kind === s.kind);
      if (slot < 0) slot = used.findIndex((u) => !u);
      if (slot >= 0) {
        used[slot] = true;
        expect(s, plannedChain[slot]!);
      } else if (s.endSeconds - s.startSeconds > plan.tolerances.restSeconds) {
        findings.push({
          code: 'rest-too-long',
          severity: 'warning',
          atSeconds: s.startSeconds,
          segmentIds: [s.id],
          message: `${sentence(segmentName(s))} lasts ${length(s.endSeconds - s.startSeconds)}, but the plan has no ${kindName(s.kind)} after ${plannedName(planned)}. Remove it or add the rest to the plan.`,
        });
      }
    }
    const missingRest = plannedChain.filter((_, idx) => !used[idx]).reduce((sum, p) => sum + p.seconds, 0);
    // When the next planned work is not marked either, its missing station/round says it all.
    const nextPlanned = schedule.segments[planned.index + 1 + plannedChain.length];
    const nextCovered = nextPlanned?.kind !== 'work' || coveredPlanned.has(nextPlanned.index);
    if (!foundRest && nextCovered && missingRest > plan.tolerances.restSeconds) {
      findings.push({
        code: 'rest-too-short',
        severity: 'warning',
        atSeconds: end,
        segmentIds: [work.id],
        message: `After ${plannedName(planned)} the plan has ${length(missingRest)} of rest, but none is marked at ${at(end)}. Mark the rest.`,
      });
    }
  }

  // Warm-up, cool-down and talk: the n-th marked one of a kind stands for the n-th planned one.
  for (const kind of ['warmup', 'cooldown', 'talk'] as const) {
    const plannedBlocks = schedule.segments.filter((p) => p.kind === kind);
    const marked = segs.filter((s) => s.kind === kind);
    marked.forEach((s, n) => {
      const p = plannedBlocks[n];
      if (p) expect(s, p);
      else {
        findings.push({
          code: 'block-length',
          severity: 'warning',
          atSeconds: s.startSeconds,
          segmentIds: [s.id],
          message: `${sentence(segmentName(s))} is not in the plan, which has ${plannedBlocks.length} ${kindName(kind)} block${plannedBlocks.length === 1 ? '' : 's'}. Change its kind, remove it, or add it to the plan.`,
        });
      }
    });
    for (const p of plannedBlocks.slice(marked.length)) {
      const when = p.startSeconds - schedule.startSeconds + origin;
      findings.push({
        code: 'block-length',
        severity: 'warning',
        atSeconds: segs.length > 0 ? when : p.startSeconds,
        segmentIds: [],
        message: `The plan has a ${length(p.seconds)} ${kindName(kind)} (${plannedPlace(p)}), but none is marked. Mark it, or take it out of the plan.`,
      });
    }
  }
  return { workPlanned, findings };
}

/**
 * Pure helpers for building a plan in a form: a new block of each kind with sensible
 * defaults, moving, duplicating and removing blocks, the planned length of a block as typed,
 * and the schema's messages keyed by field path so a form can show each at its field.
 */
import type { z } from 'zod';
import { evenStations } from './even-stations';
import {
  blockPlannedSeconds,
  DEFAULT_PLAN_OPTIONS,
  DEFAULT_TOLERANCES,
  planBlockSchema,
  planOptionsSchema,
  type PlanBlock,
  type PlanInput,
  type PlanOptions,
} from './plan-schema';

/** A block as the form holds it (may be invalid while typing). */
export type DraftBlock = z.input<typeof planBlockSchema>;
export type BlockKind = PlanBlock['kind'];

export const BLOCK_KIND_LABELS: Record<BlockKind, string> = {
  warmup: 'Warm-up',
  circuit: 'Circuit',
  intervals: 'Intervals',
  amrap: 'AMRAP',
  emom: 'EMOM',
  cooldown: 'Cool-down',
  talk: 'Talk',
};

export const BLOCK_KINDS = Object.keys(BLOCK_KIND_LABELS) as BlockKind[];

/**
 * A new block of `kind` with common starting values (common practice, no source): 5 min
 * warm-up, 3 min cool-down, 1 min talk, a 3-station 40/20 circuit of 3 rounds with a 60 s
 * round break, 8 sets of 20/10 intervals, a 12-minute AMRAP of three moves, a 10-minute EMOM
 * of two moves taking turns with 40 s of work at the top of each minute.
 */
export function newBlock(kind: BlockKind): DraftBlock {
  switch (kind) {
    case 'warmup':
      return { kind, seconds: 300 };
    case 'cooldown':
      return { kind, seconds: 180 };
    case 'talk':
      return { kind, seconds: 60 };
    case 'circuit':
      return {
        kind,
        rounds: 3,
        roundBreakSeconds: 60,
        stations: evenStations(['', '', ''], 40, 20),
      };
    case 'intervals':
      return { kind, exercise: '', sets: 8, workSeconds: 20, restSeconds: 10 };
    case 'amrap':
      return { kind, seconds: 720, exercises: ['', '', ''] };
    case 'emom':
      return { kind, minutes: 10, workSeconds: 40, exercises: ['', ''] };
  }
}

/** Moves the item at `from` to `to` (both clamped); a new array. */
export function moveItem<T>(items: readonly T[], from: number, to: number): T[] {
  const out = [...items];
  if (from < 0 || from >= out.length) return out;
  const target = Math.max(0, Math.min(out.length - 1, to));
  const [item] = out.splice(from, 1);
  out.splice(target, 0, item as T);
  return out;
}

/** A deep copy of the item at `index` inserted right after it. */
export function duplicateItem<T>(items: readonly T[], index: number): T[] {
  const item = items[index];
  if (item === undefined) return [...items];
  return [...items.slice(0, index + 1), structuredClone(item), ...items.slice(index + 1)];
}

export function removeItem<T>(items: readonly T[], index: number): T[] {
  return items.filter((_, i) => i !== index);
}

/** The planned length of a block as typed, or null while it is not valid yet. */
export function draftBlockSeconds(block: DraftBlock, options: PlanInput['options']): number | null {
  const parsed = planBlockSchema.safeParse(block);
  if (!parsed.success) return null;
  const opts: PlanOptions = planOptionsSchema.safeParse(options ?? DEFAULT_PLAN_OPTIONS).data ?? DEFAULT_PLAN_OPTIONS;
  return blockPlannedSeconds(parsed.data, opts);
}

/** The schema's first message per field path (`blocks.0.stations.1.workSeconds`), as the API's `fields`. */
export function messagesByPath(issues: readonly { path: readonly PropertyKey[]; message: string }[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of issues) {
    const key = issue.path.map(String).join('.') || '_';
    if (!(key in out)) out[key] = issue.message;
  }
  return out;
}

/** An empty plan to start from: one warm-up. */
export function emptyPlan(): PlanInput {
  return { blocks: [newBlock('warmup')], tolerances: { ...DEFAULT_TOLERANCES }, options: { ...DEFAULT_PLAN_OPTIONS } };
}

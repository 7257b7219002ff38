/**
 * "Leave it out of this class": records in the plan that one round of a circuit skips one
 * station, for a recording that really lacks it. The check then expects what the video
 * shows, and the chapters follow.
 */
import { planSchema, type Plan } from './plan-schema';

export type LeaveOutResult = { ok: true; plan: Plan } | { ok: false; message: string };

/** Leaves station `stationIndex` (0-based) out of `round` (1-based) of circuit block `blockIndex`. */
export function leaveStationOut(plan: Plan, blockIndex: number, round: number, stationIndex: number): LeaveOutResult {
  const block = plan.blocks[blockIndex];
  if (!block || block.kind !== 'circuit') return { ok: false, message: 'Only a circuit station can be left out of a round.' };
  const number = stationIndex + 1;
  const changes = [...(block.roundChanges ?? [])];
  const at = changes.findIndex((c) => c.round === round);
  const current = at >= 0 ? changes[at]! : { round };
  const skip = [...new Set([...(current.skipStations ?? []), number])].sort((a, b) => a - b);
  const next = { ...current, skipStations: skip };
  if (at >= 0) changes[at] = next;
  else changes.push(next);
  changes.sort((a, b) => a.round - b.round);
  const blocks = plan.blocks.map((b, i) => (i === blockIndex ? { ...block, roundChanges: changes } : b));
  const parsed = planSchema.safeParse({ ...plan, blocks });
  if (!parsed.success) return { ok: false, message: parsed.error.issues[0]?.message ?? 'That change would make the plan invalid.' };
  return { ok: true, plan: parsed.data };
}

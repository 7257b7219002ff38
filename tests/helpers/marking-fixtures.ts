/**
 * The invented class used by the "Mark it for me" accuracy tests and benchmark: a warm-up, a
 * circuit of 5 stations (20 s work, 10 s rest) for 4 rounds with 20 s round breaks, and a
 * cool-down: 41 parts, 42 boundaries, about 12 minutes. Invented for the tests, with known truth.
 */
import { planSchema, type Plan } from '~/lib/plan/plan-schema';

export const ACCURACY_PLAN: Plan = planSchema.parse({
  blocks: [
    { kind: 'warmup', seconds: 60 },
    {
      kind: 'circuit',
      rounds: 4,
      roundBreakSeconds: 20,
      stations: ['Squats', 'Push-ups', 'Lunges', 'Plank', 'Burpees'].map((exercise) => ({ exercise, workSeconds: 20, restSeconds: 10 })),
    },
    { kind: 'cooldown', seconds: 60 },
  ],
});

/** Share of true boundaries with a proposed boundary (same index) within `tolerance` seconds. */
export function matchedShare(truth: readonly number[], proposed: readonly number[], tolerance = 0.5): number {
  let hit = 0;
  truth.forEach((t, i) => {
    if (proposed[i] !== undefined && Math.abs(proposed[i] - t) <= tolerance) hit++;
  });
  return hit / truth.length;
}

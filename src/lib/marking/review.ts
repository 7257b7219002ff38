/**
 * Reviewing a "Mark it for me" proposal in the editor: which boundaries to look at, in order.
 */
import type { ProposedBoundary } from './propose-timeline';

/** Seconds of recording played around a boundary under review: 1.5 s before, 1.5 s after. */
export const REVIEW_PLAY_SECONDS = 3;

/**
 * Index of the next boundary under `threshold` after `fromSeconds` (wrapping to the first), or
 * null when none is uncertain. Boundaries are in time order.
 */
export function nextUncertainIndex(boundaries: readonly ProposedBoundary[], fromSeconds: number, threshold: number): number | null {
  const uncertain = boundaries.map((b, i) => ({ b, i })).filter(({ b }) => b.confidence < threshold);
  if (uncertain.length === 0) return null;
  const after = uncertain.find(({ b }) => b.atSeconds > fromSeconds + 0.05);
  return (after ?? uncertain[0]!).i;
}

/**
 * Where the player starts when a class page opens, and whether it offers to resume.
 *
 * The rule (also in DEVELOPERS.md, "Publishing and members"):
 * 1. A `#t=` fragment on a page the member *followed a link to* (navigation type `navigate`:
 *    a shared chapter link, a link typed or pasted, a new tab) is fresh: the player opens there
 *    and does not offer to resume.
 * 2. A `#t=` fragment on a *reload* or *back/forward* visit is stale: the player itself wrote it
 *    on the last chapter jump (`history.replaceState`), so it says where the member jumped to,
 *    not where they stopped. The saved position wins: the fragment is ignored and, when there is
 *    a saved position worth resuming, the member is offered to resume there.
 * 3. Without a fragment, a saved position worth resuming is offered (never played silently from
 *    there: the member chooses Resume or Start over).
 * A saved position is worth resuming when it is more than 10 s in, more than 10 s before the end,
 * and the class is not finished (closer than that, starting over costs the member nothing).
 */
export type NavigationKind = 'navigate' | 'reload' | 'back_forward' | 'prerender';

export interface StartInput {
  /** Start of the `#t=` fragment, or null when the URL has none (or an invalid one). */
  fragmentStart: number | null;
  /** `PerformanceNavigationTiming.type` of this page load. */
  navigation: NavigationKind;
  /** The member's saved position for this version of the class, 0 when none. */
  savedSeconds: number;
  durationSeconds: number;
  finished: boolean;
}

export interface StartDecision {
  /** Seek here before playing; null to start at 0. */
  seekTo: number | null;
  /** Offer "You stopped at …, Resume / Start over" for this position; null for no offer. */
  offerResumeAt: number | null;
}

const RESUME_MARGIN_SECONDS = 10;

export function worthResuming(savedSeconds: number, durationSeconds: number, finished: boolean): boolean {
  return !finished && savedSeconds > RESUME_MARGIN_SECONDS && savedSeconds < durationSeconds - RESUME_MARGIN_SECONDS;
}

export function startPosition(input: StartInput): StartDecision {
  const fresh = input.fragmentStart !== null && (input.navigation === 'navigate' || input.navigation === 'prerender');
  if (fresh) return { seekTo: Math.min(Math.max(0, input.fragmentStart!), input.durationSeconds), offerResumeAt: null };
  return { seekTo: null, offerResumeAt: worthResuming(input.savedSeconds, input.durationSeconds, input.finished) ? input.savedSeconds : null };
}

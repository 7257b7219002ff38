/**
 * The class page's islands tell each other when the plan was saved: the timeline editor
 * checks against the new plan at once, and the details form (which shares the class
 * version) sends the new version with its next save instead of a stale one.
 */
import type { Plan } from '~/lib/plan/plan-schema';

const PLAN_SAVED = 'roundmark:plan-saved';

export interface PlanSaved {
  lessonId: string;
  plan: Plan;
  /** The class version after the save. */
  version: number;
}

export function announcePlanSaved(detail: PlanSaved): void {
  // Forms rendered by the server carry the class version in a hidden field.
  document.querySelectorAll<HTMLInputElement>(`form[data-lesson-version="${detail.lessonId}"] input[name="version"]`).forEach((input) => {
    input.value = String(detail.version);
  });
  window.dispatchEvent(new CustomEvent<PlanSaved>(PLAN_SAVED, { detail }));
}

/** Calls `listener` on every plan save of `lessonId`; returns the unsubscribe. */
export function onPlanSaved(lessonId: string, listener: (saved: PlanSaved) => void): () => void {
  const handler = (e: Event) => {
    const detail = (e as CustomEvent<PlanSaved>).detail;
    if (detail?.lessonId === lessonId) listener(detail);
  };
  window.addEventListener(PLAN_SAVED, handler);
  return () => window.removeEventListener(PLAN_SAVED, handler);
}

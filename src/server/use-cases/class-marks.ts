import type { Plan } from '~/lib/plan/plan-schema';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import type { AppDeps } from '../app';
import { getLesson } from '../services/lessons';
import { putPlan, type PlanView } from '../services/lesson-plans';
import { putTimeline } from '../services/timelines';
import { assertCan, type Actor } from './actor';

/**
 * Stores a class's plan (staff) when `version` is the class's current version, and adds new
 * exercise names to the studio's list; a stale version is refused.
 */
export async function saveClassPlan(actor: Actor, deps: AppDeps, input: { lessonId: string; version: number; plan: Plan }): Promise<PlanView> {
  assertCan(actor, 'class.edit');
  return putPlan(deps, actor.studioId, input.lessonId, input.version, input.plan);
}

/**
 * Replaces a class's timeline (staff) when `version` is current; the editor's save and a
 * timeline file import both land here.
 */
export async function saveClassTimeline(
  actor: Actor,
  deps: AppDeps,
  input: { lessonId: string; version: number; timeline: Timeline },
): Promise<{ version: number }> {
  assertCan(actor, 'class.edit');
  await getLesson(deps, actor.studioId, input.lessonId);
  return putTimeline(deps, actor.studioId, input.lessonId, input.version, input.timeline);
}

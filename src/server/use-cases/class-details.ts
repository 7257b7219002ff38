import type { CreateLessonInput, LessonOutput, UpdateLessonInput } from '~/lib/api/lesson-schemas';
import type { AppDeps } from '../app';
import { createLesson, deleteLesson, getLesson, updateLesson } from '../services/lessons';
import { assertCan, type Actor } from './actor';

/** Creates a draft class (staff); the creator teaches it unless another coach is named. */
export async function createClass(actor: Actor, deps: AppDeps, input: CreateLessonInput): Promise<LessonOutput> {
  assertCan(actor, 'class.create');
  return createLesson(deps, actor.studioId, actor.userId, input);
}

/** Saves a class's details (staff) when the version read is current; a published class's card changes too. */
export async function updateClassDetails(actor: Actor, deps: AppDeps, input: { lessonId: string; details: UpdateLessonInput }): Promise<LessonOutput> {
  assertCan(actor, 'class.edit');
  return updateLesson(deps, actor.studioId, input.lessonId, input.details);
}

/** Deletes a draft class (coach, owner); published or archived classes stay for members' history. */
export async function deleteClass(actor: Actor, deps: AppDeps, input: { lessonId: string }): Promise<void> {
  // Another studio's class answers 404 before the role is considered, as everywhere else.
  assertCan(actor, 'class.delete');
  await getLesson(deps, actor.studioId, input.lessonId);
  await deleteLesson(deps, actor.studioId, input.lessonId);
}

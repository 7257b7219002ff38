import { and, eq } from 'drizzle-orm';
import { lessons } from '~/db/schema';
import type { Action } from '~/lib/policy';
import { notFound } from '../errors';
import type { AppDeps } from '../app';
import { libraryChanged } from '../services/library';
import { assertCan, type Actor } from './actor';

/** Takes a class out of the library (a draft again); versions stay for members' history. */
export const unpublishClass = (actor: Actor, deps: AppDeps, input: { lessonId: string }) =>
  withdraw(actor, deps, input.lessonId, 'class.unpublish', 'draft');

/** Archives a class: out of the library and out of the way; members who finished it still see it. */
export const archiveClass = (actor: Actor, deps: AppDeps, input: { lessonId: string }) =>
  withdraw(actor, deps, input.lessonId, 'class.archive', 'archived');

async function withdraw(actor: Actor, deps: AppDeps, lessonId: string, action: Action, state: 'draft' | 'archived'): Promise<void> {
  assertCan(actor, action);
  // A pending schedule would publish it again behind the coach's back, so it goes too.
  const updated = await deps.db
    .update(lessons)
    .set({ state, publishAt: null, publishScheduledBy: null, updatedAt: new Date() })
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, actor.studioId)))
    .returning({ id: lessons.id });
  if (!updated.length) throw notFound('That class');
  await libraryChanged(deps, actor.studioId);
}

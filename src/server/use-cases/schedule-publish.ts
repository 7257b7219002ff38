import { and, eq } from 'drizzle-orm';
import { lessons } from '~/db/schema';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';
import { assertCan, type Actor } from './actor';

export interface SchedulePublishInput {
  lessonId: string;
  /** Null when the form's date could not be read. */
  at: Date | null;
  acknowledgeWarnings: boolean;
}

/** Schedules a publish (owner only); the worker publishes once due, running the gate again then. */
export async function schedulePublish(actor: Actor, deps: AppDeps, input: SchedulePublishInput): Promise<{ scheduledFor: Date }> {
  assertCan(actor, 'class.schedule');
  const at = input.at;
  if (!at || Number.isNaN(at.getTime())) throw new AppError('invalid_input', 'Choose a date and time to publish.', { publishAt: 'Choose a date and time to publish.' });
  if (at.getTime() < Date.now() - 60_000) throw new AppError('invalid_input', 'Choose a time in the future.', { publishAt: 'Choose a time in the future.' });
  const updated = await deps.db
    .update(lessons)
    .set({ publishAt: at, publishScheduledBy: actor.userId, publishAcknowledgesWarnings: input.acknowledgeWarnings, updatedAt: new Date() })
    .where(and(eq(lessons.id, input.lessonId), eq(lessons.studioId, actor.studioId)))
    .returning({ id: lessons.id });
  if (!updated.length) throw notFound('That class');
  return { scheduledFor: at };
}

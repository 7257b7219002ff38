import { and, eq } from 'drizzle-orm';
import { lessons, studios } from '~/db/schema';
import { wallClockToInstant } from '~/lib/time/wall-clock';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';
import { assertCan, type Actor } from './actor';

export interface SchedulePublishInput {
  lessonId: string;
  /**
   * When to publish: an instant (the JSON door's ISO time with its offset), or a wall-clock time
   * as the form's `datetime-local` sends it, read in the studio's time zone on that day.
   */
  when: { at: Date } | { wallClock: string | undefined };
  acknowledgeWarnings: boolean;
}

const refuse = (message: string) => new AppError('invalid_input', message, { publishAt: message });

/** The instant the input names; a wall-clock time uses the studio's zone (its offset on that day). */
async function instantOf(deps: AppDeps, studioId: string, when: SchedulePublishInput['when']): Promise<Date> {
  if ('at' in when) {
    if (Number.isNaN(when.at.getTime())) throw refuse('Choose a date and time to publish.');
    return when.at;
  }
  const studio = await deps.db.query.studios.findFirst({ where: eq(studios.id, studioId), columns: { timeZone: true } });
  const timeZone = studio?.timeZone ?? 'UTC';
  const read = wallClockToInstant(when.wallClock, timeZone);
  if (read.ok) return read.at;
  throw refuse(
    read.reason === 'skipped'
      ? `The clocks skip that time in ${timeZone} (they move forward that night). Choose a time an hour later.`
      : 'Choose a date and time to publish.',
  );
}

/** Schedules a publish (owner only); the worker publishes once due, running the gate again then. */
export async function schedulePublish(actor: Actor, deps: AppDeps, input: SchedulePublishInput): Promise<{ scheduledFor: Date }> {
  assertCan(actor, 'class.schedule');
  const at = await instantOf(deps, actor.studioId, input.when);
  if (at.getTime() < Date.now() - 60_000) throw refuse('Choose a time in the future.');
  const updated = await deps.db
    .update(lessons)
    .set({ publishAt: at, publishScheduledBy: actor.userId, publishAcknowledgesWarnings: input.acknowledgeWarnings, updatedAt: new Date() })
    .where(and(eq(lessons.id, input.lessonId), eq(lessons.studioId, actor.studioId)))
    .returning({ id: lessons.id });
  if (!updated.length) throw notFound('That class');
  return { scheduledFor: at };
}

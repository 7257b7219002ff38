import { and, isNotNull, lte } from 'drizzle-orm';
import { lessons } from '~/db/schema';
import { AppError } from '../http/app-error';
import { publishLesson } from '../services/publishing';
import { queueAfterPublish } from '../services/after-publish';
import type { JobHandler } from './job-context';

/**
 * Publishes classes whose scheduled time has come. The timing check runs again at that moment;
 * a class that is not ready (recording still processing, errors) stays scheduled and is tried
 * again on the next run, so a scheduled demo class goes live as soon as its media is ready.
 */
export const publishDue: JobHandler<'lessons.publish-due'> = async (_data, ctx) => {
  const due = await ctx.deps.db
    .select({ id: lessons.id, studioId: lessons.studioId, by: lessons.publishScheduledBy, ack: lessons.publishAcknowledgesWarnings })
    .from(lessons)
    .where(and(isNotNull(lessons.publishAt), lte(lessons.publishAt, new Date())));
  const published: string[] = [];
  const waiting: string[] = [];
  for (const l of due) {
    try {
      await queueAfterPublish(ctx.boss, await publishLesson(ctx.deps, l.studioId, l.id, l.by, l.ack));
      published.push(l.id);
    } catch (err) {
      if (!(err instanceof AppError)) throw err;
      waiting.push(`${l.id}: ${err.message}`);
    }
  }
  return { outcome: due.length ? 'done' : 'skipped', detail: `${published.length} published, ${waiting.length} waiting${waiting.length ? ` (${waiting.join('; ')})` : ''}` };
};

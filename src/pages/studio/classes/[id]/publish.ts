import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { AppError } from '~/server/http/app-error';
import { guardPage, PUBLISHERS } from '~/server/http/guards';
import { env } from '~/server/env';
import { queue } from '~/server/queue';
import { queueAfterPublish } from '~/server/services/after-publish';
import { publishLesson, schedulePublish, setLessonState } from '~/server/services/publishing';

/** The publishing panel's form: publish, schedule (owner), unpublish or archive, then back to the class page. */
export const POST: APIRoute = async ({ locals, params, request, redirect }) => {
  const guard = guardPage(locals, PUBLISHERS);
  if (!guard.ok) return new Response('Your role in this studio does not allow this.', { status: guard.reason === 'sign-in' ? 401 : 403 });
  const form = await request.formData();
  const back = (key: 'published' | 'publish-error', message: string) =>
    redirect(`/studio/classes/${params.id}?${key}=${encodeURIComponent(message)}#publish-title`, 303);
  const { studio, user } = guard.access;
  const ack = form.get('acknowledgeWarnings') === 'true';
  try {
    switch (form.get('action')) {
      case 'publish': {
        const v = await publishLesson(app(), studio.studioId, params.id!, user.id, ack);
        await queueAfterPublish(await queue(env().DATABASE_URL), v);
        return back('published', `Published as version ${v.number}. Members see it in the library now.`);
      }
      case 'schedule': {
        if (!studio.roles.includes('owner')) throw new AppError('forbidden', 'Only the studio owner can schedule a publish.');
        const local = String(form.get('publishAt') ?? '');
        const offset = Number(form.get('timezoneOffset') ?? 0);
        const at = new Date(Date.parse(`${local}:00Z`) + offset * 60_000);
        if (!local || Number.isNaN(at.getTime())) throw new AppError('invalid_input', 'Choose a date and time to publish.');
        await schedulePublish(app(), studio.studioId, params.id!, user.id, at, ack);
        return back('published', 'Scheduled. The class goes live at that time if the check still has no errors.');
      }
      case 'unpublish':
        await setLessonState(app(), studio.studioId, params.id!, 'draft');
        return back('published', 'Taken out of the library. Nothing was deleted.');
      case 'archive':
        await setLessonState(app(), studio.studioId, params.id!, 'archived');
        return back('published', 'Archived.');
      default:
        return back('publish-error', 'Choose what to do.');
    }
  } catch (err) {
    if (err instanceof AppError) return back('publish-error', err.message);
    throw err;
  }
};

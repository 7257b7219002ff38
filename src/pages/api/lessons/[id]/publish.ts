import type { APIRoute } from 'astro';
import { publishInput } from '~/lib/api/publish-schemas';
import { app } from '~/server/app';
import { endpoint, json, readJson } from '~/server/http/api';
import { PUBLISHERS, requireRole } from '~/server/http/guards';
import { AppError } from '~/server/http/app-error';
import { queue } from '~/server/queue';
import { queueAfterPublish } from '~/server/services/after-publish';
import { env } from '~/server/env';
import { publishLesson, schedulePublish } from '~/server/services/publishing';

/** Publishes now (coach, owner) or at a set time (owner only). Editors prepare but do not publish. */
export const POST: APIRoute = endpoint(async ({ locals, params, request }) => {
  const { studio, user } = requireRole(locals, PUBLISHERS);
  const input = await readJson(request, publishInput);
  if (input.publishAt) {
    if (!studio.roles.includes('owner')) throw new AppError('forbidden', 'Only the studio owner can schedule a publish.');
    await schedulePublish(app(), studio.studioId, params.id!, user.id, new Date(input.publishAt), input.acknowledgeWarnings);
    return json({ scheduledFor: input.publishAt }, 202);
  }
  const published = await publishLesson(app(), studio.studioId, params.id!, user.id, input.acknowledgeWarnings);
  await queueAfterPublish(await queue(env().DATABASE_URL), published);
  return json(published, 201);
});

import type { APIRoute } from 'astro';
import { publishedOutput, publishInput, scheduledOutput } from '~/lib/api/publish-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { publishClass } from '~/server/use-cases/publish-class';
import { schedulePublish } from '~/server/use-cases/schedule-publish';

/** Publishes now (coach, owner) or at a set time (owner only). Editors prepare but do not publish. */
export const POST: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const input = await readJson(request, publishInput);
  if (input.publishAt) {
    await schedulePublish(actor, app(), { lessonId: params.id!, when: { at: new Date(input.publishAt) }, acknowledgeWarnings: input.acknowledgeWarnings });
    return answer(scheduledOutput, { scheduledFor: input.publishAt }, 202);
  }
  return answer(publishedOutput, await publishClass(actor, app(), { lessonId: params.id!, acknowledgeWarnings: input.acknowledgeWarnings }), 201);
});

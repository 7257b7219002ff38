import type { APIRoute } from 'astro';
import { unpublishedOutput } from '~/lib/api/publish-schemas';
import { app } from '~/server/app';
import { answer, endpoint } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { unpublishClass } from '~/server/use-cases/withdraw-class';

/** Takes the class out of the library; its versions stay for members' history. */
export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  await unpublishClass(requireActor(locals), app(), { lessonId: params.id! });
  return answer(unpublishedOutput, { state: 'draft' });
});

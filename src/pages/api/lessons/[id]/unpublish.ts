import type { APIRoute } from 'astro';
import { app } from '~/server/app';
import { endpoint, json } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { unpublishClass } from '~/server/use-cases/withdraw-class';

/** Takes the class out of the library; its versions stay for members' history. */
export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  await unpublishClass(requireActor(locals), app(), { lessonId: params.id! });
  return json({ state: 'draft' });
});

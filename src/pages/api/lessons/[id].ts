import type { APIRoute } from 'astro';
import { updateLessonInput } from '~/lib/api/lesson-schemas';
import { app } from '~/server/app';
import { endpoint, json, readJson } from '~/server/http/api';
import { PUBLISHERS, requireRole, STAFF } from '~/server/http/guards';
import { deleteLesson, getLesson, updateLesson } from '~/server/services/lessons';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireRole(locals, STAFF);
  return json(await getLesson(app(), studio.studioId, params.id!));
});

export const PATCH: APIRoute = endpoint(async ({ locals, params, request }) => {
  const { studio } = requireRole(locals, STAFF);
  const input = await readJson(request, updateLessonInput);
  return json(await updateLesson(app(), studio.studioId, params.id!, input));
});

/** Editors prepare recordings but do not remove classes. */
export const DELETE: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireRole(locals, PUBLISHERS);
  await deleteLesson(app(), studio.studioId, params.id!);
  return new Response(null, { status: 204 });
});

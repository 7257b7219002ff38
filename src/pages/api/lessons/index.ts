import type { APIRoute } from 'astro';
import { createLessonInput } from '~/lib/api/lesson-schemas';
import { app } from '~/server/app';
import { endpoint, json, readJson } from '~/server/http/api';
import { requireRole, STAFF } from '~/server/http/guards';
import { createLesson, listLessons } from '~/server/services/lessons';

export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { studio } = requireRole(locals, STAFF);
  return json({ lessons: await listLessons(app(), studio.studioId) });
});

export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const { studio, user } = requireRole(locals, STAFF);
  const input = await readJson(request, createLessonInput);
  return json(await createLesson(app(), studio.studioId, user.id, input), 201);
});

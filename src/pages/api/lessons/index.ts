import type { APIRoute } from 'astro';
import { createLessonInput, lessonListOutput, lessonOutput } from '~/lib/api/lesson-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor, requireCan } from '~/server/http/guards';
import { listLessons } from '~/server/services/lessons';
import { createClass } from '~/server/use-cases/class-details';

export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { studio } = requireCan(locals, 'class.view');
  return answer(lessonListOutput, { lessons: await listLessons(app(), studio.studioId) });
});

export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const actor = requireActor(locals);
  const input = await readJson(request, createLessonInput);
  return answer(lessonOutput, await createClass(actor, app(), input), 201);
});

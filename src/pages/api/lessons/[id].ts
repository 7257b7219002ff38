import type { APIRoute } from 'astro';
import { lessonOutput, updateLessonInput } from '~/lib/api/lesson-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor, requireCan } from '~/server/http/guards';
import { getLesson } from '~/server/services/lessons';
import { deleteClass, updateClassDetails } from '~/server/use-cases/class-details';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'class.view');
  return answer(lessonOutput, await getLesson(app(), studio.studioId, params.id!));
});

export const PATCH: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const details = await readJson(request, updateLessonInput);
  return answer(lessonOutput, await updateClassDetails(actor, app(), { lessonId: params.id!, details }));
});

/** Editors prepare recordings but do not remove classes. */
export const DELETE: APIRoute = endpoint(async ({ locals, params }) => {
  await deleteClass(requireActor(locals), app(), { lessonId: params.id! });
  return new Response(null, { status: 204 });
});

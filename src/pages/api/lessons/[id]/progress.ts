import type { APIRoute } from 'astro';
import { progressInput, progressOutput, progressRecordedOutput } from '~/lib/api/publish-schemas';
import { app } from '~/server/app';
import { AppError } from '~/server/errors';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireUser } from '~/server/http/guards';
import { progressOf, recordProgress } from '~/server/services/member-classes';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { user } = requireUser(locals);
  const row = await progressOf(app(), user.id, params.id!);
  return answer(progressOutput, { positionSeconds: row?.positionSeconds ?? 0, finished: !!row?.finishedAt });
});

/** Playback reports (also sent with sendBeacon on leave, hence text/plain JSON is accepted). */
export const POST: APIRoute = endpoint(async ({ locals, params, request }) => {
  const { user } = requireUser(locals);
  if (!locals.studio) throw new AppError('forbidden', 'Join the studio to watch its classes.');
  // readJson parses the text whatever its content type, so a sendBeacon's text/plain works.
  return answer(progressRecordedOutput, await recordProgress(app(), locals.studio.studioId, user.id, params.id!, await readJson(request, progressInput)));
});

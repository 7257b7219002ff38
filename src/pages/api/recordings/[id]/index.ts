import type { APIRoute } from 'astro';
import { eq } from 'drizzle-orm';
import { lessons } from '~/db/schema';
import { endpoint, json } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { mediaDeps } from '~/server/media-deps';
import { recordingOf, toRecordingOutput } from '~/server/services/recordings';

/** State, step and progress of one recording (the class page polls this). */
export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'recording.upload');
  const deps = mediaDeps();
  const rec = await recordingOf(deps, studio.studioId, params.id!);
  const [lesson] = await deps.db.select({ current: lessons.currentRecordingId }).from(lessons).where(eq(lessons.id, rec.lessonId));
  return json(toRecordingOutput(rec, lesson?.current ?? null));
});

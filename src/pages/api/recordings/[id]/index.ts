import type { APIRoute } from 'astro';
import { recordingOutput } from '~/lib/api/recording-schemas';
import { answer, endpoint } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { mediaDeps } from '~/server/media-deps';
import { currentRecordingIdOf } from '~/server/services/lessons';
import { recordingOf, toRecordingOutput } from '~/server/services/recordings';

/** State, step and progress of one recording (the class page polls this). */
export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'recording.upload');
  const deps = mediaDeps();
  const rec = await recordingOf(deps, studio.studioId, params.id!);
  return answer(recordingOutput, toRecordingOutput(rec, await currentRecordingIdOf(deps, rec.lessonId)));
});

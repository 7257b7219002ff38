import type { APIRoute } from 'astro';
import { recordingOutput } from '~/lib/api/recording-schemas';
import { answer, endpoint } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { mediaDeps } from '~/server/media-deps';
import { completeUpload } from '~/server/services/recordings';

/** The browser reports the store finished the upload; the server checks it and starts processing. */
export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'recording.upload');
  return answer(recordingOutput, await completeUpload(mediaDeps(), studio.studioId, params.id!));
});

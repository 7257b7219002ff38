import type { APIRoute } from 'astro';
import { recordingOutput } from '~/lib/api/recording-schemas';
import { answer, endpoint } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { mediaDeps } from '~/server/media-deps';
import { cancelUpload } from '~/server/services/recordings';

/** Cancels an unfinished upload right away (instead of waiting for the daily clean-up). */
export const POST: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'recording.upload');
  return answer(recordingOutput, await cancelUpload(mediaDeps(), studio.studioId, params.id!));
});

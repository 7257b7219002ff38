import type { APIRoute } from 'astro';
import { signedRequestOutput, signUploadInput } from '~/lib/api/recording-schemas';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { mediaDeps } from '~/server/media-deps';
import { signUpload } from '~/server/services/recordings';

/** Presigns one S3 request of the browser's multipart upload. */
export const POST: APIRoute = endpoint(async ({ locals, params, request }) => {
  const { studio } = requireCan(locals, 'recording.upload');
  return answer(signedRequestOutput, await signUpload(mediaDeps(), studio.studioId, params.id!, await readJson(request, signUploadInput)));
});

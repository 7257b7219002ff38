import type { APIRoute } from 'astro';
import { createRecordingInput, recordingListOutput, recordingOutput } from '~/lib/api/recording-schemas';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { mediaDeps } from '~/server/media-deps';
import { createRecording, listRecordings } from '~/server/services/recordings';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'recording.upload');
  return answer(recordingListOutput, { recordings: await listRecordings(mediaDeps(), studio.studioId, params.id!) });
});

/** Announces an upload: the server checks type and size and chooses where the file goes. */
export const POST: APIRoute = endpoint(async ({ locals, params, request }) => {
  const { studio, user } = requireCan(locals, 'recording.upload');
  const input = await readJson(request, createRecordingInput);
  return answer(recordingOutput, await createRecording(mediaDeps(), studio.studioId, params.id!, user.id, input), 201);
});

import type { APIRoute } from 'astro';
import { coverOutput } from '~/lib/api/cover-schemas';
import { MAX_COVER_UPLOAD_BYTES } from '~/lib/publishing/cover';
import { app } from '~/server/app';
import { answer, endpoint, readBodyBytes } from '~/server/http/api';
import { requireActor } from '~/server/http/guards';
import { storage } from '~/server/storage';
import { uploadClassCover } from '~/server/use-cases/class-cover';

/** The picture's bytes are the body (any content type: the bytes decide what it is). */
export const POST: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = requireActor(locals);
  const bytes = await readBodyBytes(request, MAX_COVER_UPLOAD_BYTES);
  return answer(coverOutput, await uploadClassCover(actor, app(), storage(), { lessonId: params.id!, bytes }));
});

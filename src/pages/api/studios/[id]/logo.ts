import type { APIRoute } from 'astro';
import { studioIdentityOutput } from '~/lib/api/studio-schemas';
import { MAX_LOGO_UPLOAD_BYTES } from '~/lib/studios/studio-logo';
import { app } from '~/server/app';
import { answer, endpoint, readBodyBytes } from '~/server/http/api';
import { actorIn } from '~/server/http/guards';
import { storage } from '~/server/storage';
import { deleteStudioLogo, uploadStudioLogo } from '~/server/use-cases/studio-settings';

/** The logo's bytes are the body (any content type: the bytes decide what it is). */
export const PUT: APIRoute = endpoint(async ({ locals, params, request }) => {
  const actor = actorIn(locals, params.id!);
  const bytes = await readBodyBytes(request, MAX_LOGO_UPLOAD_BYTES);
  return answer(studioIdentityOutput, await uploadStudioLogo(actor, app(), storage(), bytes));
});

export const DELETE: APIRoute = endpoint(async ({ locals, params }) => {
  const actor = actorIn(locals, params.id!);
  return answer(studioIdentityOutput, await deleteStudioLogo(actor, app(), storage()));
});

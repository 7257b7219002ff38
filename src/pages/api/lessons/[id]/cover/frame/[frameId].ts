import type { APIRoute } from 'astro';
import { coverFrameOutput } from '~/lib/api/cover-schemas';
import { app } from '~/server/app';
import { answer, endpoint } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { getCoverFrame } from '~/server/services/cover-frames';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'class.view');
  return answer(coverFrameOutput, await getCoverFrame(app(), studio.studioId, params.id!, params.frameId!));
});

import type { APIRoute } from 'astro';
import { proposalOutput, proposeInput } from '~/lib/api/marking-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { proposeClassTimeline } from '~/server/services/recording-events';

/** "Mark it for me": a proposed timeline from the plan and the recording's sounds; nothing is saved. */
export const POST: APIRoute = endpoint(async ({ locals, params, request }) => {
  const { studio } = requireCan(locals, 'class.edit');
  await readJson(request, proposeInput);
  return answer(proposalOutput, await proposeClassTimeline(app(), studio.studioId, params.id!));
});

import type { APIRoute } from 'astro';
import { versionListOutput } from '~/lib/api/publish-schemas';
import { app } from '~/server/app';
import { answer, endpoint } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { listVersions } from '~/server/services/publishing';

export const GET: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'class.view');
  return answer(versionListOutput, { versions: (await listVersions(app(), studio.studioId, params.id!)).map((v) => ({ ...v, publishedAt: v.publishedAt.toISOString() })) });
});

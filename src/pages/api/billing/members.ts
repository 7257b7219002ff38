import type { APIRoute } from 'astro';
import { memberListOutput, membersQuery } from '~/lib/api/billing-schemas';
import { membersCsv } from '~/lib/billing/members-csv';
import { app } from '~/server/app';
import { answer, endpoint, parseWith } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { listMembers } from '~/server/services/billing-members';

/** The members table (owner); `?format=csv` downloads it. */
export const GET: APIRoute = endpoint(async ({ locals, url }) => {
  const { studio } = requireCan(locals, 'members.view');
  const query = parseWith(membersQuery, Object.fromEntries(url.searchParams));
  const members = await listMembers(app(), studio.studioId, query);
  if (query.format === 'csv') {
    const day = new Date().toISOString().slice(0, 10);
    return new Response(membersCsv(members), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="${studio.studioSlug}-members-${day}.csv"`,
        'cache-control': 'no-store',
      },
    });
  }
  return answer(memberListOutput, { members });
});

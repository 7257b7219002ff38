import type { APIRoute } from 'astro';
import { membershipOutput } from '~/lib/api/billing-schemas';
import { app } from '~/server/app';
import { answer, endpoint } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { membershipAnswer, membershipOf } from '~/server/services/billing';

/** The signed-in member's own membership. */
export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { user, studio } = requireCan(locals, 'membership.manage');
  return answer(membershipOutput, membershipAnswer(await membershipOf(app(), studio.studioId, user.id)));
});

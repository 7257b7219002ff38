import type { APIRoute } from 'astro';
import { invitationParams } from '~/lib/api/mail-schemas';
import { app } from '~/server/app';
import { endpoint } from '~/server/http/api';
import { notFound } from '~/server/errors';
import { requireCan } from '~/server/http/guards';
import { revokeInvitation } from '~/server/services/invitations';

/** Withdraws a pending invitation (owner); its link stops working. */
export const DELETE: APIRoute = endpoint(async ({ locals, params }) => {
  const { studio } = requireCan(locals, 'team.manage');
  const parsed = invitationParams.safeParse(params);
  // A malformed id cannot name an invitation: same answer as an unknown one.
  if (!parsed.success) throw notFound('That invitation');
  await revokeInvitation(app(), studio.studioId, parsed.data.id);
  return new Response(null, { status: 204 });
});

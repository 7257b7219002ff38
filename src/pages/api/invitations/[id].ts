import type { APIRoute } from 'astro';
import { invitationParams } from '~/lib/api/mail-schemas';
import { app } from '~/server/app';
import { endpoint } from '~/server/http/api';
import { notFound } from '~/server/errors';
import { requireActor } from '~/server/http/guards';
import { withdrawInvitation } from '~/server/use-cases/team';

/** Withdraws a pending invitation (owner); its link stops working. */
export const DELETE: APIRoute = endpoint(async ({ locals, params }) => {
  const actor = requireActor(locals);
  const parsed = invitationParams.safeParse(params);
  // A malformed id cannot name an invitation: same answer as an unknown one.
  if (!parsed.success) throw notFound('That invitation');
  await withdrawInvitation(actor, app(), { id: parsed.data.id });
  return new Response(null, { status: 204 });
});

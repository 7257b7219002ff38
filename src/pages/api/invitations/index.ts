import type { APIRoute } from 'astro';
import { createInvitationInput, invitationListOutput, invitationOutput, type InvitationOutput } from '~/lib/api/mail-schemas';
import { app } from '~/server/app';
import { answer, endpoint, readJson } from '~/server/http/api';
import { requireActor, requireCan } from '~/server/http/guards';
import { teamOverview } from '~/server/services/invitations';
import { inviteToTeam } from '~/server/use-cases/team';

const view = (i: { id: string; email: string; role: InvitationOutput['role']; expiresAt: Date; createdAt: Date }) => ({
  id: i.id,
  email: i.email,
  role: i.role,
  expiresAt: i.expiresAt.toISOString(),
  createdAt: i.createdAt.toISOString(),
});

/** Pending invitations of the studio (owner). */
export const GET: APIRoute = endpoint(async ({ locals }) => {
  const { studio } = requireCan(locals, 'team.manage');
  const { pending } = await teamOverview(app(), studio.studioId);
  return answer(invitationListOutput, { invitations: pending.map(view) });
});

/** Invites a coach or an editor by e-mail (owner); the e-mail goes out before this answers. */
export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const actor = requireActor(locals);
  const inv = await inviteToTeam(actor, app(), await readJson(request, createInvitationInput));
  return answer(invitationOutput, view(inv), 201);
});

import type { APIRoute } from 'astro';
import { createInvitationInput } from '~/lib/api/mail-schemas';
import { app } from '~/server/app';
import { endpoint, json, readJson } from '~/server/http/api';
import { requireCan } from '~/server/http/guards';
import { inviteStaff, teamOverview } from '~/server/services/invitations';

const view = (i: { id: string; email: string; role: string; expiresAt: Date; createdAt: Date }) => ({
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
  return json({ invitations: pending.map(view) });
});

/** Invites a coach or an editor by e-mail (owner); the e-mail goes out before this answers. */
export const POST: APIRoute = endpoint(async ({ locals, request }) => {
  const { studio, user } = requireCan(locals, 'team.manage');
  const inv = await inviteStaff(app(), studio.studioId, user.id, await readJson(request, createInvitationInput));
  return json(view(inv), 201);
});

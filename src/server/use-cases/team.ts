import type { CreateInvitationInput } from '~/lib/api/mail-schemas';
import type { AppDeps } from '../app';
import { inviteStaff, revokeInvitation, type PendingInvitation } from '../services/invitations';
import { assertCan, type Actor } from './actor';

/** Invites a coach or an editor by e-mail (owner); the invitation is kept only if its e-mail went out. */
export async function inviteToTeam(actor: Actor, deps: AppDeps, input: CreateInvitationInput): Promise<PendingInvitation> {
  assertCan(actor, 'team.manage');
  return inviteStaff(deps, actor.studioId, actor.userId, input);
}

/** Withdraws a pending invitation (owner); its link stops working. */
export async function withdrawInvitation(actor: Actor, deps: AppDeps, input: { id: string }): Promise<void> {
  assertCan(actor, 'team.manage');
  await revokeInvitation(deps, actor.studioId, input.id);
}

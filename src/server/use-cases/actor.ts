import { can, refusalFor, type Action, type Actor } from '~/lib/policy';
import { AppError } from '../errors';

export type { Actor } from '~/lib/policy';

/** Throws `forbidden` with the table's words unless the actor may do this. Every use case starts here. */
export function assertCan(actor: Actor, action: Action): void {
  if (!can(actor, action)) throw new AppError('forbidden', refusalFor(action));
}

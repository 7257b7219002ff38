import type { Role } from '../api/auth-schemas';
import { PUBLISHERS } from '../policy';

/**
 * "Ready for review": an editor's hand-off of a prepared class to the people who publish it.
 * The rules here are pure so the use cases, the pages and the tests read the same ones.
 */

/** Lesson states, as the lessons table has them. */
export type LessonState = 'draft' | 'published' | 'archived';

/** Why a class cannot be handed off for review now, or null when it can. */
export function reviewRequestRefusal(state: LessonState): string | null {
  return state === 'archived'
    ? 'An archived class cannot be marked ready for review. Ask a coach or the owner to bring it back first.'
    : null;
}

/** Why a class cannot be sent back now, or null when it can (only an open hand-off is sent back). */
export function sendBackRefusal(open: boolean): string | null {
  return open ? null : 'This class is not waiting for review, so there is nothing to send back. Reload the page to see its state.';
}

/**
 * Who is told that a class waits for review: everyone who may publish it (coaches and the owner),
 * once each, except the person who handed it off.
 */
export function reviewRecipients(staff: readonly { userId: string; role: Role }[], preparedBy: string | null): string[] {
  const publishers: readonly Role[] = PUBLISHERS;
  const ids = staff.filter((p) => publishers.includes(p.role) && p.userId !== preparedBy).map((p) => p.userId);
  return [...new Set(ids)];
}

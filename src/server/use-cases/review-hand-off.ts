import type { ReadyForReviewInput, SendBackInput } from '~/lib/api/review-schemas';
import type { AppDeps } from '../app';
import { clearReview, requestReview, type ReviewRequest } from '../services/review-requests';
import { assertCan, type Actor } from './actor';

/**
 * Marks a class ready for review with an optional note (anyone who prepares classes; editors hand
 * off to coaches and the owner, who publish). The e-mail to them is queued here, keyed by the
 * hand-off's time so a double click or a retry sends one.
 */
export async function markReadyForReview(actor: Actor, deps: AppDeps, input: { lessonId: string } & ReadyForReviewInput): Promise<ReviewRequest> {
  assertCan(actor, 'class.request-review');
  const request = await requestReview(deps, actor.studioId, actor.userId, input.lessonId, input.note);
  const at = request.requestedAt.toISOString();
  await deps.jobs('mail.review-requested', { lessonId: input.lessonId, requestedAt: at }, `mail.review-requested:${input.lessonId}:${at}`);
  return request;
}

/**
 * A coach or the owner sends a class back without publishing it: the hand-off is cleared and
 * whoever prepared it is told what needs another look (unless they sent it back themselves).
 */
export async function sendBackForChanges(actor: Actor, deps: AppDeps, input: { lessonId: string } & SendBackInput): Promise<{ sentBackTo: string | null }> {
  assertCan(actor, 'class.send-back');
  const cleared = await clearReview(deps, actor.studioId, input.lessonId);
  if (cleared.preparedById && cleared.preparedById !== actor.userId) {
    const sentAt = new Date().toISOString();
    await deps.jobs(
      'mail.review-sent-back',
      { lessonId: input.lessonId, userId: cleared.preparedById, sentBy: actor.userId, note: input.note, sentAt },
      `mail.review-sent-back:${input.lessonId}:${sentAt}`,
    );
  }
  return { sentBackTo: cleared.preparedBy };
}

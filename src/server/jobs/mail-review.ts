import { sendReviewRequested, sendReviewSentBack } from '../mail/messages';
import { openReviewAt, reviewers } from '../services/review-requests';
import type { JobHandler } from './job-context';
import { sendOnce, sendToEach } from './sent-once';

/**
 * Tells the studio's coaches and owner that a class is ready for review. Each person gets one
 * message per hand-off (keyed by the hand-off's time), so a retry sends only the rest; a hand-off
 * replaced, sent back or published meanwhile is not mailed any more.
 */
export const mailReviewRequested: JobHandler<'mail.review-requested'> = async ({ lessonId, requestedAt }, ctx) => {
  const open = await openReviewAt(ctx.deps, lessonId, new Date(requestedAt));
  if (!open) return { outcome: 'skipped', detail: 'hand-off replaced, sent back or published' };
  const recipients = await reviewers(ctx.deps, open.studioId, open.preparedById);
  const note = open.note;
  const sent = await sendToEach(
    ctx.deps,
    recipients,
    (userId) => `review-requested:${lessonId}:${requestedAt}:${userId}`,
    (userId) => sendReviewRequested(ctx.deps, { userId, lessonId, preparedBy: open.preparedById, note }),
  );
  return { outcome: recipients.length ? 'done' : 'skipped', detail: `${sent} sent of ${recipients.length}` };
};

/** Tells whoever prepared a class that a coach or the owner sent it back, with their note (once per send-back). */
export const mailReviewSentBack: JobHandler<'mail.review-sent-back'> = async ({ lessonId, userId, sentBy, note, sentAt }, ctx) => {
  const sent = await sendOnce(ctx.deps, `review-sent-back:${lessonId}:${sentAt}`, () => sendReviewSentBack(ctx.deps, { userId, lessonId, sentBy, note }));
  return { outcome: sent ? 'done' : 'skipped', detail: sent ? 'sent' : 'already sent' };
};

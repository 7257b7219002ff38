import { and, asc, eq, isNotNull, ne } from 'drizzle-orm';
import { lessons, memberships, users } from '~/db/schema';
import { reviewRecipients, reviewRequestRefusal, sendBackRefusal } from '~/lib/publishing/review-hand-off';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';

/** Who prepared a class for review, when, and what they wrote. */
export interface ReviewRequest {
  lessonId: string;
  title: string;
  preparedBy: string | null;
  requestedAt: Date;
  note: string;
}

const requestColumns = {
  lessonId: lessons.id,
  title: lessons.title,
  preparedBy: users.name,
  requestedAt: lessons.reviewRequestedAt,
  note: lessons.reviewNote,
};

type RequestRow = { lessonId: string; title: string; preparedBy: string | null; requestedAt: Date | null; note: string | null };
const asRequest = (r: RequestRow): ReviewRequest => ({ ...r, requestedAt: r.requestedAt!, note: r.note ?? '' });

/**
 * Marks a class ready for review (again: a later hand-off replaces the earlier one). Answers the
 * stored hand-off; its time keys the e-mail so a retry never sends it twice.
 */
export async function requestReview(deps: AppDeps, studioId: string, userId: string, lessonId: string, note: string): Promise<ReviewRequest> {
  return deps.db.transaction(async (tx) => {
    const [lesson] = await tx
      .select({ state: lessons.state })
      .from(lessons)
      .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)))
      .for('update');
    if (!lesson) throw notFound('That class');
    const refusal = reviewRequestRefusal(lesson.state);
    if (refusal) throw new AppError('conflict', refusal);
    const requestedAt = new Date();
    await tx
      .update(lessons)
      .set({ reviewRequestedBy: userId, reviewRequestedAt: requestedAt, reviewNote: note || null })
      .where(eq(lessons.id, lessonId));
    const [row] = await tx.select(requestColumns).from(lessons).leftJoin(users, eq(users.id, lessons.reviewRequestedBy)).where(eq(lessons.id, lessonId));
    return asRequest(row!);
  });
}

/**
 * Clears an open hand-off without publishing (a coach or the owner sends the class back). Answers
 * the hand-off as it was, so the person who prepared it can be told.
 */
export async function clearReview(deps: AppDeps, studioId: string, lessonId: string): Promise<ReviewRequest & { preparedById: string | null }> {
  return deps.db.transaction(async (tx) => {
    const [row] = await tx
      .select({ ...requestColumns, preparedById: lessons.reviewRequestedBy })
      .from(lessons)
      .leftJoin(users, eq(users.id, lessons.reviewRequestedBy))
      .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)))
      .for('update', { of: lessons });
    if (!row) throw notFound('That class');
    const refusal = sendBackRefusal(row.requestedAt !== null);
    if (refusal) throw new AppError('conflict', refusal);
    await tx.update(lessons).set({ reviewRequestedBy: null, reviewRequestedAt: null, reviewNote: null }).where(eq(lessons.id, lessonId));
    return { ...asRequest(row), preparedById: row.preparedById };
  });
}

/** Classes waiting for review in a studio, oldest hand-off first. */
export async function reviewList(deps: AppDeps, studioId: string): Promise<ReviewRequest[]> {
  const rows = await deps.db
    .select(requestColumns)
    .from(lessons)
    .leftJoin(users, eq(users.id, lessons.reviewRequestedBy))
    .where(and(eq(lessons.studioId, studioId), isNotNull(lessons.reviewRequestedAt), ne(lessons.state, 'archived')))
    .orderBy(asc(lessons.reviewRequestedAt));
  return rows.map(asRequest);
}

/** The open hand-off of one class, if any (the publishing panel shows it). */
export async function reviewOf(deps: AppDeps, studioId: string, lessonId: string): Promise<ReviewRequest | null> {
  const [row] = await deps.db
    .select(requestColumns)
    .from(lessons)
    .leftJoin(users, eq(users.id, lessons.reviewRequestedBy))
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId), isNotNull(lessons.reviewRequestedAt)));
  return row ? asRequest(row) : null;
}

/**
 * The hand-off still open at exactly this moment, with the studio and who asked (the mail job
 * reads it: a hand-off replaced, sent back or published meanwhile is not mailed).
 */
export async function openReviewAt(deps: AppDeps, lessonId: string, requestedAt: Date) {
  const [row] = await deps.db
    .select({ studioId: lessons.studioId, preparedById: lessons.reviewRequestedBy, note: lessons.reviewNote })
    .from(lessons)
    .where(and(eq(lessons.id, lessonId), eq(lessons.reviewRequestedAt, requestedAt)));
  return row ? { ...row, note: row.note ?? '' } : null;
}

/** The studio's coaches and owner (who publish), except whoever asked: they get the e-mail. */
export async function reviewers(deps: AppDeps, studioId: string, preparedBy: string | null): Promise<string[]> {
  const staff = await deps.db.select({ userId: memberships.userId, role: memberships.role }).from(memberships).where(eq(memberships.studioId, studioId));
  return reviewRecipients(staff, preparedBy);
}

import { and, eq } from 'drizzle-orm';
import { billingSettings, invitations, lessonVersions, lessons, studios, subscriptions, users } from '~/db/schema';
import type { AppDeps } from '../app';
import { env } from '../env';
import { deliver } from './transport';
import { clockOf, formatInstant, type StudioClock } from '~/lib/time/date-format';
import { TOKEN_LIFETIME } from './tokens';
import { passwordResetMessage, signUpAttemptMessage, verifyEmailMessage } from './templates/account-messages';
import { invitationMessage } from './templates/team-messages';
import { reviewRequestedMessage, reviewSentBackMessage } from './templates/review-messages';
import { classPublishedMessage, paymentFailedMessage, trialEndingMessage } from './templates/member-messages';

// Each function looks up what its message needs, builds absolute links from PUBLIC_BASE_URL and
// sends through the SMTP transport. They throw when the SMTP server refuses, so jobs retry.

/** An absolute link into the app. */
export function absoluteUrl(path: string): string {
  return new URL(path, env().PUBLIC_BASE_URL).toString();
}

/** "Friday 6 March 2026" as the studio reads it (its zone and locale). */
const formatDay = (d: Date, studio: { clock: StudioClock }) => formatInstant(d, studio.clock, 'weekday');

async function studioNamed(deps: AppDeps, where: { id: string } | { slug: string }): Promise<{ id: string; name: string; slug: string; clock: StudioClock }> {
  const row = await deps.db.query.studios.findFirst({
    where: 'id' in where ? eq(studios.id, where.id) : eq(studios.slug, where.slug),
  });
  if (!row) throw new Error(`studio ${JSON.stringify(where)} not found`);
  return { id: row.id, name: row.name, slug: row.slug, clock: clockOf(row) };
}

async function person(deps: AppDeps, userId: string) {
  const row = await deps.db.query.users.findFirst({ where: eq(users.id, userId) });
  if (!row) throw new Error(`user ${userId} not found`);
  return row;
}

/** The "confirm your address" message with a fresh token (made by the caller). */
export async function sendVerifyEmail(deps: AppDeps, m: { userId: string; token: string }): Promise<void> {
  const [user, studio] = await Promise.all([person(deps, m.userId), studioNamed(deps, { slug: deps.studioSlug })]);
  const content = verifyEmailMessage({
    studioName: studio.name,
    name: user.name,
    url: absoluteUrl(`/verify-email?token=${encodeURIComponent(m.token)}`),
    validHours: TOKEN_LIFETIME.verifyEmailHours,
  });
  await deliver({ ...content, studio, to: { name: user.name, address: user.email } });
}

/** "Someone tried to sign up with your address": sent to an account's owner instead of a second account. */
export async function sendSignUpAttempt(deps: AppDeps, m: { userId: string; signInPath?: string }): Promise<void> {
  const [user, studio] = await Promise.all([person(deps, m.userId), studioNamed(deps, { slug: deps.studioSlug })]);
  const content = signUpAttemptMessage({
    studioName: studio.name,
    name: user.name,
    signInUrl: absoluteUrl(m.signInPath ? `/sign-in?next=${encodeURIComponent(m.signInPath)}` : '/sign-in'),
    resetUrl: absoluteUrl('/forgot-password'),
  });
  await deliver({ ...content, studio, to: { name: user.name, address: user.email } });
}

/** The password reset link. */
export async function sendPasswordReset(deps: AppDeps, m: { userId: string; token: string }): Promise<void> {
  const [user, studio] = await Promise.all([person(deps, m.userId), studioNamed(deps, { slug: deps.studioSlug })]);
  const content = passwordResetMessage({
    studioName: studio.name,
    name: user.name,
    url: absoluteUrl(`/reset-password?token=${encodeURIComponent(m.token)}`),
    validMinutes: TOKEN_LIFETIME.resetPasswordMinutes,
  });
  await deliver({ ...content, studio, to: { name: user.name, address: user.email } });
}

/** The staff invitation. */
export async function sendInvitation(deps: AppDeps, m: { invitationId: string; token: string }): Promise<void> {
  const inv = await deps.db.query.invitations.findFirst({ where: eq(invitations.id, m.invitationId) });
  if (!inv) throw new Error(`invitation ${m.invitationId} not found`);
  const studio = await studioNamed(deps, { id: inv.studioId });
  const inviter = inv.invitedBy ? await deps.db.query.users.findFirst({ where: eq(users.id, inv.invitedBy) }) : undefined;
  const content = invitationMessage({
    studioName: studio.name,
    inviterName: inviter?.name ?? null,
    role: inv.role,
    url: absoluteUrl(`/invitations/${encodeURIComponent(m.token)}`),
    expiresOn: formatDay(inv.expiresAt, studio),
  });
  await deliver({ ...content, studio, to: { name: '', address: inv.email } });
}

/** What the new-class message shows of a published version (from its snapshot). */
export interface PublishedClass {
  studioId: string;
  title: string;
  slug: string;
  coachName: string;
  minutes: number;
  description: string | null;
}

/** Reads a published version's details, or null when the version is gone. */
export async function publishedClass(deps: AppDeps, versionId: string): Promise<(PublishedClass & { number: number }) | null> {
  const [row] = await deps.db
    .select({ snapshot: lessonVersions.snapshot, number: lessonVersions.number, studioId: lessons.studioId })
    .from(lessonVersions)
    .innerJoin(lessons, eq(lessons.id, lessonVersions.lessonId))
    .where(eq(lessonVersions.id, versionId));
  if (!row) return null;
  const d = (row.snapshot as { details: { title: string; slug: string; coachName: string; advertisedMinutes: number; description?: string | null } }).details;
  return {
    studioId: row.studioId,
    number: row.number,
    title: d.title,
    slug: d.slug,
    coachName: d.coachName,
    minutes: d.advertisedMinutes,
    description: d.description?.trim() || null,
  };
}

/** Tells one member about a newly published class. */
export async function sendClassPublished(deps: AppDeps, m: { userId: string; cls: PublishedClass }): Promise<void> {
  const [user, studio] = await Promise.all([person(deps, m.userId), studioNamed(deps, { id: m.cls.studioId })]);
  const content = classPublishedMessage({
    studioName: studio.name,
    name: user.name,
    title: m.cls.title,
    coachName: m.cls.coachName,
    minutes: m.cls.minutes,
    description: m.cls.description,
    url: absoluteUrl(`/s/${studio.slug}/classes/${encodeURIComponent(m.cls.slug)}`),
    preferencesUrl: absoluteUrl('/account#email-title'),
  });
  await deliver({ ...content, studio, to: { name: user.name, address: user.email } });
}

function formatPrice(minor: number, currency: string): string {
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() }).format(minor / 100);
}

/** The "trial ends soon" reminder for one subscription. */
export async function sendTrialEnding(deps: AppDeps, m: { subscriptionId: string; now?: Date }): Promise<void> {
  const sub = await deps.db.query.subscriptions.findFirst({ where: eq(subscriptions.id, m.subscriptionId) });
  if (!sub?.trialEnd) throw new Error(`subscription ${m.subscriptionId} has no trial end`);
  const [user, studio, settings] = await Promise.all([
    person(deps, sub.userId),
    studioNamed(deps, { id: sub.studioId }),
    deps.db.query.billingSettings.findFirst({ where: eq(billingSettings.studioId, sub.studioId) }),
  ]);
  const hoursLeft = (sub.trialEnd.getTime() - (m.now ?? new Date()).getTime()) / 3_600_000;
  const content = trialEndingMessage({
    studioName: studio.name,
    name: user.name,
    endsOn: formatDay(sub.trialEnd, studio),
    daysLeft: Math.max(1, Math.ceil(hoursLeft / 24)),
    price: settings ? formatPrice(settings.monthlyPriceMinor, settings.currency) : null,
    continues: !sub.cancelAtPeriodEnd,
    accountUrl: absoluteUrl('/account'),
  });
  await deliver({ ...content, studio, to: { name: user.name, address: user.email } });
}

/**
 * Tells a member that a charge failed and where to fix it. Called by the payments webhook when
 * the provider reports a failed invoice payment; the webhook's own idempotency keeps it to one
 * message per event.
 */
export async function sendPaymentFailed(deps: AppDeps, m: { userId: string; studioId: string }): Promise<void> {
  const [user, studio, settings] = await Promise.all([
    person(deps, m.userId),
    studioNamed(deps, { id: m.studioId }),
    deps.db.query.billingSettings.findFirst({ where: and(eq(billingSettings.studioId, m.studioId)) }),
  ]);
  const content = paymentFailedMessage({
    studioName: studio.name,
    name: user.name,
    graceDays: settings?.pastDueGraceDays ?? null,
    accountUrl: absoluteUrl('/account'),
  });
  await deliver({ ...content, studio, to: { name: user.name, address: user.email } });
}

/** The class page's publishing panel, where a review happens. */
const reviewUrl = (lessonId: string) => absoluteUrl(`/studio/classes/${encodeURIComponent(lessonId)}#publish-title`);

async function lessonTitle(deps: AppDeps, lessonId: string): Promise<{ title: string; studioId: string }> {
  const row = await deps.db.query.lessons.findFirst({ where: eq(lessons.id, lessonId), columns: { title: true, studioId: true } });
  if (!row) throw new Error(`lesson ${lessonId} not found`);
  return row;
}

/** Tells one coach (or the owner) that a class waits for their review. */
export async function sendReviewRequested(deps: AppDeps, m: { userId: string; lessonId: string; preparedBy: string | null; note: string }): Promise<void> {
  const lesson = await lessonTitle(deps, m.lessonId);
  const [user, studio, preparer] = await Promise.all([
    person(deps, m.userId),
    studioNamed(deps, { id: lesson.studioId }),
    m.preparedBy ? deps.db.query.users.findFirst({ where: eq(users.id, m.preparedBy) }) : undefined,
  ]);
  const content = reviewRequestedMessage({
    studioName: studio.name,
    name: user.name,
    preparedBy: preparer?.name ?? 'Someone on the team',
    title: lesson.title,
    note: m.note,
    url: reviewUrl(m.lessonId),
  });
  await deliver({ ...content, studio, to: { name: user.name, address: user.email } });
}

/** Tells whoever prepared a class that it was sent back, with the reviewer's note. */
export async function sendReviewSentBack(deps: AppDeps, m: { userId: string; lessonId: string; sentBy: string; note: string }): Promise<void> {
  const lesson = await lessonTitle(deps, m.lessonId);
  const [user, studio, reviewer] = await Promise.all([person(deps, m.userId), studioNamed(deps, { id: lesson.studioId }), person(deps, m.sentBy)]);
  const content = reviewSentBackMessage({ studioName: studio.name, name: user.name, sentBy: reviewer.name, title: lesson.title, note: m.note, url: reviewUrl(m.lessonId) });
  await deliver({ ...content, studio, to: { name: user.name, address: user.email } });
}

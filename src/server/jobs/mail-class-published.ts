import { and, eq, isNotNull } from 'drizzle-orm';
import { emailPreferences, memberships, users } from '~/db/schema';
import type { AppDeps } from '../app';
import { publishedClass, sendClassPublished } from '../mail/messages';
import type { JobHandler } from './job-context';
import { sendToEach } from './sent-once';

/**
 * People of the studio who asked to hear about new classes. Unconfirmed addresses are left out:
 * an optional message should not go to an address that may have been mistyped.
 */
export async function newClassRecipients(deps: AppDeps, studioId: string): Promise<string[]> {
  const rows = await deps.db
    .selectDistinct({ userId: users.id })
    .from(emailPreferences)
    .innerJoin(users, eq(users.id, emailPreferences.userId))
    .innerJoin(memberships, and(eq(memberships.userId, users.id), eq(memberships.studioId, emailPreferences.studioId)))
    .where(and(eq(emailPreferences.studioId, studioId), eq(emailPreferences.newClasses, true), isNotNull(users.emailVerifiedAt)));
  return rows.map((r) => r.userId);
}

/**
 * Tells opted-in members about a class's first published version. Each member gets it once
 * (keyed by version and person), so a retry after a partial failure sends only the rest.
 */
export const mailClassPublished: JobHandler<'mail.class-published'> = async ({ versionId }, ctx) => {
  const cls = await publishedClass(ctx.deps, versionId);
  if (!cls) return { outcome: 'skipped', detail: 'version gone' };
  if (cls.number !== 1) return { outcome: 'skipped', detail: `version ${cls.number} is a republish` };
  const recipients = await newClassRecipients(ctx.deps, cls.studioId);
  const sent = await sendToEach(ctx.deps, recipients, (userId) => `class-published:${versionId}:${userId}`, (userId) => sendClassPublished(ctx.deps, { userId, cls }));
  return { outcome: recipients.length ? 'done' : 'skipped', detail: `${sent} sent of ${recipients.length} opted in` };
};

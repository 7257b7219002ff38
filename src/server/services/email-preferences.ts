import { and, eq } from 'drizzle-orm';
import { emailPreferences } from '~/db/schema';
import type { EmailPreferencesInput } from '~/lib/api/mail-schemas';
import type { AppDeps } from '../app';

/** A person's optional e-mails from a studio; nothing optional is sent until they opt in. */
export async function getEmailPreferences(deps: AppDeps, userId: string, studioId: string): Promise<EmailPreferencesInput> {
  const row = await deps.db.query.emailPreferences.findFirst({
    where: and(eq(emailPreferences.userId, userId), eq(emailPreferences.studioId, studioId)),
  });
  return { newClasses: row?.newClasses ?? false };
}

/** Saves the choices. */
export async function setEmailPreferences(deps: AppDeps, userId: string, studioId: string, input: EmailPreferencesInput): Promise<void> {
  await deps.db
    .insert(emailPreferences)
    .values({ userId, studioId, newClasses: input.newClasses })
    .onConflictDoUpdate({
      target: [emailPreferences.userId, emailPreferences.studioId],
      set: { newClasses: input.newClasses, updatedAt: new Date() },
    });
}

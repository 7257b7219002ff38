import { eq } from 'drizzle-orm';
import { sentNotices } from '~/db/schema';
import type { AppDeps } from '../app';

/**
 * Sends a message at most once per key. The key is claimed first, so two workers never both
 * send; if sending fails the claim is dropped and the job's retry tries again.
 * Returns false when the key was already used.
 */
export async function sendOnce(deps: AppDeps, key: string, send: () => Promise<void>): Promise<boolean> {
  const claimed = await deps.db.insert(sentNotices).values({ key }).onConflictDoNothing().returning({ key: sentNotices.key });
  if (!claimed.length) return false;
  try {
    await send();
  } catch (err) {
    await deps.db.delete(sentNotices).where(eq(sentNotices.key, key));
    throw err;
  }
  return true;
}

/**
 * Sends one message to each recipient, each at most once per key. A failure for one person does
 * not stop the others; the first failure is thrown at the end so the job's retry sends only the rest.
 * Answers how many were sent by this run.
 */
export async function sendToEach(deps: AppDeps, recipients: readonly string[], keyFor: (userId: string) => string, send: (userId: string) => Promise<void>): Promise<number> {
  let sent = 0;
  let failed: unknown;
  for (const userId of recipients) {
    try {
      if (await sendOnce(deps, keyFor(userId), () => send(userId))) sent++;
    } catch (err) {
      failed ??= err;
    }
  }
  if (failed) throw failed;
  return sent;
}

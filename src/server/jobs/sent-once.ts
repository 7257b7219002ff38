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

import type PgBoss from 'pg-boss';
import { sendJob } from '../queue';

/** Work that follows every publish: chapter thumbnails, and the new-class e-mail for a first version. */
export async function queueAfterPublish(boss: PgBoss, published: { versionId: string; number: number }): Promise<void> {
  await sendJob(boss, 'version.thumbnails', { versionId: published.versionId }, `version.thumbnails:${published.versionId}`);
  if (published.number === 1) {
    await sendJob(boss, 'mail.class-published', { versionId: published.versionId }, `mail.class-published:${published.versionId}`);
  }
}

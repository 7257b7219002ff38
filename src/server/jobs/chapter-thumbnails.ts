import { mkdir } from 'node:fs/promises';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { lessonVersions, recordings } from '~/db/schema';
import type { VersionSnapshot } from '../services/publishing';
import { recordingPrefix } from '../services/recordings';
import { runFfmpeg } from '../media/ffmpeg-runner';
import { buildChapterThumbnailArgs } from '~/lib/media/chapter-thumbnail-args';
import type { JobHandler } from './job-context';
import { cleanScratch, ensureSource, uploadFolder } from './recording-files';

/** One small JPEG per chapter of a published version, taken a moment into the chapter. */
export const chapterThumbnails: JobHandler<'version.thumbnails'> = async ({ versionId }, ctx) => {
  const [row] = await ctx.deps.db
    .select({ version: lessonVersions, rec: recordings })
    .from(lessonVersions)
    .innerJoin(recordings, eq(recordings.id, lessonVersions.recordingId))
    .where(eq(lessonVersions.id, versionId));
  if (!row) return { outcome: 'skipped', detail: 'version is gone' };
  const { chapters } = row.version.snapshot as VersionSnapshot;
  const dir = join(ctx.workDir, `thumbs-${versionId}`);
  const out = join(dir, 'out');
  await mkdir(out, { recursive: true });
  const source = join(dir, 'source');
  await ensureSource(ctx.s3, ctx.bucket, row.rec.sourceKey, source, row.rec.sizeBytes, ctx.signal);
  for (const c of chapters) {
    await runFfmpeg(buildChapterThumbnailArgs({ input: source, output: join(out, `${c.index + 1}.jpg`), chapter: c, colorTransfer: row.rec.colorTransfer }), { signal: ctx.signal });
  }
  await uploadFolder(ctx.s3, ctx.bucket, out, `${recordingPrefix(row.rec)}media/chapters/${versionId}/`, ctx.signal);
  await cleanScratch(dir);
  return { outcome: 'done', detail: `${chapters.length} thumbnails` };
};

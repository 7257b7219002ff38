import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { recordings } from '~/db/schema';
import { probeVerdict } from '~/lib/media/probe-verdict';
import { probeFile } from '../media/ffmpeg-runner';
import { failRecording } from '../services/recordings';
import type { JobHandler } from './job-context';
import { ensureSource, progressReporter, recordingDir } from './recording-files';

/** Reads the uploaded file's facts; refuses what cannot become a class, then queues packaging. */
export const probeRecording: JobHandler<'recording.probe'> = async ({ recordingId }, ctx) => {
  const [rec] = await ctx.deps.db.select().from(recordings).where(eq(recordings.id, recordingId));
  if (!rec || rec.state !== 'processing') return { outcome: 'skipped', detail: `recording is ${rec?.state ?? 'gone'}` };
  const report = progressReporter(ctx.deps, rec.id, 'probe');
  await report(0, true);
  const source = join(recordingDir(ctx.workDir, rec.id), 'source');
  await ensureSource(ctx.s3, ctx.bucket, rec.sourceKey, source, rec.sizeBytes, ctx.signal);
  const verdict = probeVerdict(await probeFile(source));
  if (!verdict.ok) {
    await failRecording(ctx.deps, rec.id, verdict.reason);
    return { outcome: 'failed', detail: verdict.reason };
  }
  const facts = verdict.summary;
  await ctx.deps.db
    .update(recordings)
    .set({
      durationSeconds: facts.durationSeconds,
      width: facts.width,
      height: facts.height,
      frameRate: facts.frameRate ?? null,
      hasAudio: facts.hasAudio,
      warnings: verdict.warnings,
      step: 'package',
      progress: 0,
      updatedAt: new Date(),
    })
    .where(eq(recordings.id, rec.id));
  await ctx.send('recording.package', { recordingId: rec.id }, `recording.package:${rec.id}`);
  return { outcome: 'done' };
};

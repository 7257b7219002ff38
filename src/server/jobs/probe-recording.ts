import { join } from 'node:path';
import { probeVerdict } from '~/lib/media/probe-verdict';
import { probeFile } from '../media/ffmpeg-runner';
import { applyEvent, loadRecording, reportProgress } from '../services/recording-lifecycle';
import type { JobHandler } from './job-context';
import { ensureSource, recordingDir } from './recording-files';

/** Reads the uploaded file's facts; refuses what cannot become a class, then queues packaging. */
export const probeRecording: JobHandler<'recording.probe'> = async ({ recordingId }, ctx) => {
  const rec = await loadRecording(ctx.deps, recordingId);
  if (!rec || rec.state !== 'processing' || rec.step !== 'probe') return { outcome: 'skipped', detail: `recording is ${rec ? `${rec.state}/${rec.step}` : 'gone'}` };
  await reportProgress(ctx.deps, rec.id, 'probe', 0);
  const source = join(recordingDir(ctx.workDir, rec.id), 'source');
  await ensureSource(ctx.s3, ctx.bucket, rec.sourceKey, source, rec.sizeBytes, ctx.signal);
  const verdict = probeVerdict(await probeFile(source));
  if (!verdict.ok) {
    await applyEvent(ctx.deps, rec, 'refused', { failureReason: verdict.reason });
    return { outcome: 'failed', detail: verdict.reason };
  }
  const facts = verdict.summary;
  const moved = await applyEvent(ctx.deps, rec, 'probed', {
    durationSeconds: facts.durationSeconds,
    width: facts.width,
    height: facts.height,
    frameRate: facts.frameRate ?? null,
    hasAudio: facts.hasAudio,
    warnings: verdict.warnings,
  });
  if (moved) await ctx.send('recording.package', { recordingId: rec.id }, `recording.package:${rec.id}`);
  return { outcome: moved ? 'done' : 'skipped', detail: moved ? undefined : 'changed meanwhile' };
};

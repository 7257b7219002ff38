import { join } from 'node:path';
import { packetLength } from '~/lib/media/media-length';
import { needsMeasuring, probeVerdict } from '~/lib/media/probe-verdict';
import { lastVideoPacketSeconds, probeFile } from '../media/ffmpeg-runner';
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
  const probe = await probeFile(source);
  // The packets, not the container's claim, decide the length: browser WebM claims nothing, a cut file too much.
  let measuredSeconds: number | null | undefined;
  if (needsMeasuring(probe)) {
    const frameRate = probe.streams.find((s) => s.type === 'video' && !s.attachedPicture)?.frameRate;
    measuredSeconds = packetLength(await lastVideoPacketSeconds(source, ctx.signal), frameRate);
  }
  const verdict = probeVerdict(probe, measuredSeconds === undefined ? {} : { measuredSeconds });
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
    containerSeconds: facts.containerSeconds ?? null,
    colorTransfer: facts.colorTransfer ?? null,
    warnings: verdict.warnings,
  });
  if (moved) await ctx.send('recording.package', { recordingId: rec.id }, `recording.package:${rec.id}`);
  return { outcome: moved ? 'done' : 'skipped', detail: moved ? undefined : 'changed meanwhile' };
};

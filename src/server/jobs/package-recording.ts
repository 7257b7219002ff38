import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { buildPackageArgs, buildPosterArgs, chooseLadder } from '~/lib/media/hls-ladder';
import { displayGainDb, isTooQuiet, scalePeaks } from '~/lib/media/loudness';
import { encodePeaks, peaksMaxDb, silentPeaks, DEFAULT_PEAKS_RATE } from '~/lib/media/peaks';
import { SILENT_AUDIO_DB, WARNINGS } from '~/lib/media/probe-verdict';
import { analyseAudio, runFfmpeg } from '../media/ffmpeg-runner';
import { libraryChanged } from '../services/library';
import { recordingPrefix } from '../services/recordings';
import { applyEvent, loadRecording, markReady, reportProgress, startHeartbeat } from '../services/recording-lifecycle';
import type { JobHandler } from './job-context';
import { cleanScratch, ensureSource, recordingDir, uploadFolder } from './recording-files';

/**
 * Writes the HLS ladder, poster and peaks, uploads them under the recording's prefix, and makes
 * the recording current for its class. Output paths are fixed, so a retry after a crash
 * overwrites the same objects: one set of outputs, never two.
 */
export const packageRecording: JobHandler<'recording.package'> = async ({ recordingId }, ctx) => {
  let rec = await loadRecording(ctx.deps, recordingId);
  if (!rec || rec.state !== 'processing' || (rec.step !== 'package' && rec.step !== 'upload-outputs')) {
    return { outcome: 'skipped', detail: `recording is ${rec ? `${rec.state}/${rec.step}` : 'gone'}` };
  }
  if (!rec.durationSeconds || !rec.width || !rec.height) return { outcome: 'skipped', detail: 'no probe facts' };
  const facts = {
    durationSeconds: rec.durationSeconds,
    width: rec.width,
    height: rec.height,
    frameRate: rec.frameRate ?? 30,
    hasAudio: !!rec.hasAudio,
    colorTransfer: rec.colorTransfer ?? undefined,
  };
  const dir = recordingDir(ctx.workDir, rec.id);
  const source = join(dir, 'source');
  const out = join(dir, 'media');
  // The heartbeat runs on its own timer, so a long poster, peaks or upload phase is not mistaken for a dead worker.
  const stopHeartbeat = startHeartbeat(ctx.deps, rec.id, ['package', 'upload-outputs'], ctx.heartbeatSeconds);
  try {
    await cleanScratch(out); // a half-written earlier attempt must not leak into this one
    await mkdir(join(out, 'hls'), { recursive: true });
    const step = rec.step;
    let lastReport = 0;
    const report = (percent: number) => {
      if (Date.now() - lastReport < 1000) return;
      lastReport = Date.now();
      void reportProgress(ctx.deps, recordingId, step, percent);
    };
    await ensureSource(ctx.s3, ctx.bucket, rec.sourceKey, source, rec.sizeBytes, ctx.signal);

    const ladder = chooseLadder(facts);
    // The ladder takes ~90 % of the time; poster, peaks and upload the rest.
    await runFfmpeg(buildPackageArgs({ input: source, outputDir: join(out, 'hls'), probe: facts, ladder }), {
      durationSeconds: facts.durationSeconds,
      signal: ctx.signal,
      onProgress: (p) => report(p.percent * 0.9),
    });
    await runFfmpeg(buildPosterArgs({ input: source, output: join(out, 'poster.jpg'), probe: facts }), { signal: ctx.signal });
    await reportProgress(ctx.deps, rec.id, step, 92);
    const audio = facts.hasAudio
      ? await analyseAudio(source, DEFAULT_PEAKS_RATE, { durationSeconds: facts.durationSeconds, signal: ctx.signal })
      : { peaks: silentPeaks(facts.durationSeconds, DEFAULT_PEAKS_RATE), integratedLufs: null };
    // The waveform (and the editor's onset finding, which reads it) is lifted by the measured loudness.
    await writeFile(join(out, 'peaks.bin'), encodePeaks(scalePeaks(audio.peaks, displayGainDb(audio.integratedLufs))));
    const warnings = [...rec.warnings];
    const silent = facts.hasAudio && peaksMaxDb(audio.peaks) <= SILENT_AUDIO_DB;
    if (silent && !warnings.includes(WARNINGS.silentAudio)) warnings.push(WARNINGS.silentAudio);
    if (!silent && isTooQuiet(audio.integratedLufs)) {
      const quiet = WARNINGS.quiet(audio.integratedLufs!);
      if (!warnings.includes(quiet)) warnings.push(quiet);
    }
    if (rec.step === 'package') {
      if (!(await applyEvent(ctx.deps, rec, 'packaged'))) return { outcome: 'skipped', detail: 'changed meanwhile' };
      rec = (await loadRecording(ctx.deps, rec.id))!;
    }
    const prefix = `${recordingPrefix(rec)}media/`;
    await uploadFolder(ctx.s3, ctx.bucket, out, prefix, ctx.signal);
    const ready = await markReady(ctx.deps, rec, {
      durationSeconds: facts.durationSeconds,
      loudnessLufs: audio.integratedLufs,
      warnings,
      outputPrefix: prefix,
      renditions: ladder,
      peaksRate: DEFAULT_PEAKS_RATE,
    });
    if (!ready) return { outcome: 'skipped', detail: 'changed meanwhile' };
    await libraryChanged(ctx.deps, rec.studioId); // a published class's card shows the new poster
    await cleanScratch(dir);
    // "Mark it for me" needs the recording's audio events; hearing them does not hold up readiness.
    await ctx.send('recording.audio-events', { recordingId: rec.id }, `recording.audio-events:${rec.id}`);
    return { outcome: 'done', detail: `${ladder.length} renditions` };
  } catch (err) {
    // Half-written outputs would only fill the scratch disk until the retry; the source stays for it.
    await cleanScratch(out).catch(() => {});
    throw err;
  } finally {
    stopHeartbeat();
  }
};

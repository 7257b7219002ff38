import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { and, eq, isNull, lt, or, sql } from 'drizzle-orm';
import { lessons, recordings } from '~/db/schema';
import { buildPackageArgs, buildPosterArgs, chooseLadder } from '~/lib/media/hls-ladder';
import { encodePeaks, peaksMaxDb, silentPeaks, DEFAULT_PEAKS_RATE } from '~/lib/media/peaks';
import { SILENT_AUDIO_DB, WARNINGS } from '~/lib/media/probe-verdict';
import { computeFilePeaks, runFfmpeg } from '../media/ffmpeg-runner';
import { libraryChanged } from '../services/library';
import { recordingPrefix } from '../services/recordings';
import type { JobHandler } from './job-context';
import { cleanScratch, ensureSource, progressReporter, recordingDir, uploadFolder } from './recording-files';

/**
 * Writes the HLS ladder, poster and peaks, uploads them under the recording's prefix, and makes
 * the recording current for its class. Output paths are fixed, so a retry after a crash
 * overwrites the same objects: one set of outputs, never two.
 */
export const packageRecording: JobHandler<'recording.package'> = async ({ recordingId }, ctx) => {
  const [rec] = await ctx.deps.db.select().from(recordings).where(eq(recordings.id, recordingId));
  if (!rec || rec.state !== 'processing') return { outcome: 'skipped', detail: `recording is ${rec?.state ?? 'gone'}` };
  if (!rec.durationSeconds || !rec.width || !rec.height) {
    await ctx.send('recording.probe', { recordingId }, `recording.probe:${recordingId}:again`);
    return { outcome: 'skipped', detail: 'not probed yet' };
  }
  const facts = { durationSeconds: rec.durationSeconds, width: rec.width, height: rec.height, frameRate: rec.frameRate ?? 30, hasAudio: !!rec.hasAudio };
  const dir = recordingDir(ctx.workDir, rec.id);
  const source = join(dir, 'source');
  const out = join(dir, 'media');
  await cleanScratch(out); // a half-written earlier attempt must not leak into this one
  await mkdir(join(out, 'hls'), { recursive: true });
  const report = progressReporter(ctx.deps, rec.id, 'package');
  await report(0, true);
  await ensureSource(ctx.s3, ctx.bucket, rec.sourceKey, source, rec.sizeBytes, ctx.signal);

  const ladder = chooseLadder(facts);
  // The ladder takes ~90 % of the time; poster, peaks and upload the rest.
  await runFfmpeg(buildPackageArgs({ input: source, outputDir: join(out, 'hls'), probe: facts, ladder }), {
    durationSeconds: facts.durationSeconds,
    signal: ctx.signal,
    onProgress: (p) => void report(p.percent * 0.9),
  });
  await runFfmpeg(buildPosterArgs({ input: source, output: join(out, 'poster.jpg'), probe: facts }), { signal: ctx.signal });
  await report(92, true);
  const peaks = facts.hasAudio
    ? await computeFilePeaks(source, DEFAULT_PEAKS_RATE, { durationSeconds: facts.durationSeconds, signal: ctx.signal })
    : silentPeaks(facts.durationSeconds, DEFAULT_PEAKS_RATE);
  await writeFile(join(out, 'peaks.bin'), encodePeaks(peaks));
  const warnings = [...rec.warnings];
  if (facts.hasAudio && peaksMaxDb(peaks) <= SILENT_AUDIO_DB && !warnings.includes(WARNINGS.silentAudio)) {
    warnings.push(WARNINGS.silentAudio);
  }
  await report(95, true);
  const prefix = `${recordingPrefix(rec)}media/`;
  await ctx.deps.db.update(recordings).set({ step: 'upload-outputs', updatedAt: new Date() }).where(eq(recordings.id, rec.id));
  await uploadFolder(ctx.s3, ctx.bucket, out, prefix, ctx.signal);

  await ctx.deps.db.transaction(async (tx) => {
    await tx
      .update(recordings)
      .set({
        state: 'ready',
        step: null,
        progress: 100,
        warnings,
        outputPrefix: prefix,
        renditions: ladder,
        peaksRate: DEFAULT_PEAKS_RATE,
        readyAt: new Date(),
        updatedAt: new Date(),
      })
      .where(eq(recordings.id, rec.id));
    // A newer upload replaces the current recording only now that it is ready (members see no gap);
    // an older recording finishing late does not push out a newer current one.
    await tx
      .update(lessons)
      .set({ currentRecordingId: rec.id, mediaSeconds: facts.durationSeconds, updatedAt: new Date() })
      .where(
        and(
          eq(lessons.id, rec.lessonId),
          or(
            isNull(lessons.currentRecordingId),
            lt(sql`(select created_at from recordings where id = ${lessons.currentRecordingId})`, rec.createdAt),
          ),
        ),
      );
  });
  await libraryChanged(ctx.deps, rec.studioId); // a published class's card shows the new poster
  await cleanScratch(dir);
  return { outcome: 'done', detail: `${ladder.length} renditions` };
};

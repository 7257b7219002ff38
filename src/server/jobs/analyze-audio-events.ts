import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { recordings } from '~/db/schema';
import { analyzeRecordingAudio } from '../media/analyze-recording-audio';
import { storeRecordingEvents } from '../services/recording-events';
import type { JobHandler } from './job-context';
import { cleanScratch, ensureSource, recordingDir } from './recording-files';

/**
 * Hears a ready recording's audio events (timer tones, whistles, speech, level changes) and
 * stores them with it, replacing earlier ones: a retry overwrites, never duplicates. Queued when
 * packaging finishes, and once at worker start for ready recordings that have none.
 */
export const analyzeAudioEvents: JobHandler<'recording.audio-events'> = async ({ recordingId }, ctx) => {
  const [rec] = await ctx.deps.db.select().from(recordings).where(eq(recordings.id, recordingId));
  if (!rec || rec.state !== 'ready') return { outcome: 'skipped', detail: `recording is ${rec?.state ?? 'gone'}` };
  const started = Date.now();
  if (rec.hasAudio === false) {
    await storeRecordingEvents(ctx.deps.db, rec, [], 0);
    return { outcome: 'done', detail: 'no audio stream: no events' };
  }
  const dir = join(recordingDir(ctx.workDir, rec.id), 'audio-events');
  const source = join(dir, 'source');
  try {
    await ensureSource(ctx.s3, ctx.bucket, rec.sourceKey, source, rec.sizeBytes, ctx.signal);
    const options = rec.durationSeconds ? { durationSeconds: rec.durationSeconds, signal: ctx.signal } : { signal: ctx.signal };
    const { events } = await analyzeRecordingAudio(source, options);
    await storeRecordingEvents(ctx.deps.db, rec, events, (Date.now() - started) / 1000);
    return { outcome: 'done', detail: `${events.length} events` };
  } finally {
    await cleanScratch(dir);
  }
};

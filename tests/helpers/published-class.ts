import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { ApiClient } from './api-client';
import { makeClip } from './media-files';
import { uploadWhole, waitForRecording } from './upload-flow';

/**
 * A 12 s class of two 4 s work / 2 s rest sets, with a real uploaded and processed recording and
 * a timeline that matches its plan. Advertised at 1 minute, so the check warns about the length.
 */
export const SMALL_PLAN = {
  blocks: [{ kind: 'intervals', exercise: 'Step-up', sets: 2, workSeconds: 4, restSeconds: 2 }],
  options: { dropFinalRest: false },
};

export const smallTimeline = (shift = 0) => ({
  segments: [
    { id: 'w1', kind: 'work', startSeconds: 0 + shift, endSeconds: 4 + shift, exercise: 'Step-up', set: 1 },
    { id: 'r1', kind: 'rest', startSeconds: 4 + shift, endSeconds: 6 + shift, set: 1 },
    { id: 'w2', kind: 'work', startSeconds: 6 + shift, endSeconds: 10 + shift, exercise: 'Step-up', set: 2 },
    { id: 'r2', kind: 'rest', startSeconds: 10 + shift, endSeconds: 12 + shift, set: 2 },
  ],
  cues: [{ id: 'c1', atSeconds: 1, kind: 'form', text: 'Drive through the heel.' }],
});

/**
 * Uploads a generated test-pattern clip of `seconds` as the class's newest recording and waits
 * until it is ready (and so the class's current one); answers its id.
 */
export async function uploadReadyRecording(coach: ApiClient, dir: string, lessonId: string, seconds: number): Promise<string> {
  const clip = join(dir, `${lessonId}-${seconds}s.mp4`);
  await makeClip(clip, { seconds, size: '320x180' });
  const { recordingId } = await uploadWhole(coach, lessonId, 'class.mp4', new Uint8Array(await readFile(clip)));
  const ready = await waitForRecording(coach, recordingId);
  if (ready.state !== 'ready') throw new Error(`recording ${ready.state}: ${ready.failureReason}`);
  return recordingId;
}

export async function createSmallClass(coach: ApiClient, dir: string, title: string, details: Record<string, unknown> = {}) {
  const lesson = await (await coach.post('/api/lessons', { title, advertisedMinutes: 1, impact: 'low', ...details })).json();
  await coach.put(`/api/lessons/${lesson.id}/plan`, { version: lesson.version, ...SMALL_PLAN });
  await coach.put(`/api/lessons/${lesson.id}/timeline`, { version: 0, ...smallTimeline() });
  const recordingId = await uploadReadyRecording(coach, dir, lesson.id, 12);
  return { lessonId: lesson.id as string, slug: lesson.slug as string, recordingId };
}

/** The timeline editor's calls to our API (same origin, session cookie) and to the media proxy. */
import { planSchema, type Plan } from '~/lib/plan/plan-schema';
import { timelineContentSchema, type Timeline } from '~/lib/timeline/timeline-schema';
import { decodePeaks, type Peaks } from '~/lib/media/peaks';
import { proposalOutput, type ProposalOutput } from '~/lib/api/marking-schemas';
import type { LessonOutput } from '~/lib/api/lesson-schemas';
import type { RecordingListOutput, RecordingOutput } from '~/lib/api/recording-schemas';
import type { PlanViewOutput, TimelineOutput, TimelineSavedOutput } from '~/lib/api/timeline-schemas';
import { apiCall, ApiError } from '../api-client';

/** Calls our API; the messages remind that the marks stay on this device. */
const call = <T,>(method: 'GET' | 'PUT' | 'POST', path: string, body?: unknown) =>
  apiCall<T>(method, path, body, {
    offlineMessage: 'We could not reach Roundmark. Check your connection; your marks are kept on this device.',
    signedOutMessage: 'Your session has ended. Sign in again in another tab, then save; your marks are kept on this device.',
  });

/** A recording as the API answers it (the shared output schema's type, not a copy). */
export type EditorRecording = RecordingOutput;

export interface EditorData {
  lesson: Pick<LessonOutput, 'id' | 'title' | 'advertisedMinutes' | 'mediaSeconds'>;
  plan: Plan | null;
  /** The class version the plan was read at (a plan change from the editor sends it back). */
  planVersion: number;
  version: number;
  timeline: Timeline;
  recording: EditorRecording | null;
  /** A recording still uploading or processing (shown as a note). */
  preparing: EditorRecording | null;
}

const lessonPath = (id: string) => `/api/lessons/${encodeURIComponent(id)}`;

/** The recording to mark: the current ready one, else the newest ready one. */
export function pickRecording(list: readonly EditorRecording[]): EditorRecording | null {
  const ready = list.filter((r) => r.state === 'ready');
  return ready.find((r) => r.isCurrent) ?? [...ready].sort((a, b) => b.createdAt.localeCompare(a.createdAt))[0] ?? null;
}

export async function loadEditorData(lessonId: string): Promise<EditorData> {
  const [lesson, planView, stored, recs] = await Promise.all([
    call<LessonOutput>('GET', lessonPath(lessonId)),
    call<PlanViewOutput>('GET', `${lessonPath(lessonId)}/plan`),
    loadTimeline(lessonId),
    call<RecordingListOutput>('GET', `${lessonPath(lessonId)}/recordings`),
  ]);
  const parsedPlan = planView.plan ? planSchema.safeParse(planView.plan) : null;
  const recording = pickRecording(recs.recordings);
  const preparing = recording ? null : recs.recordings.find((r) => r.state === 'uploading' || r.state === 'processing') ?? null;
  return { lesson, plan: parsedPlan?.success ? parsedPlan.data : null, planVersion: planView.version, ...stored, recording, preparing };
}

/** The recording to mark (if one is ready now) and one still being prepared, for polling. */
export async function loadRecordingState(lessonId: string): Promise<Pick<EditorData, 'recording' | 'preparing'>> {
  const recs = await call<RecordingListOutput>('GET', `${lessonPath(lessonId)}/recordings`);
  const recording = pickRecording(recs.recordings);
  const preparing = recording ? null : recs.recordings.find((r) => r.state === 'uploading' || r.state === 'processing') ?? null;
  return { recording, preparing };
}

export async function loadTimeline(lessonId: string): Promise<{ version: number; timeline: Timeline }> {
  const data = await call<TimelineOutput>('GET', `${lessonPath(lessonId)}/timeline`);
  return { version: data.version, timeline: timelineContentSchema.parse({ segments: data.segments, cues: data.cues }) };
}

export type SaveOutcome = { ok: true; version: number } | { ok: false; conflict: true; currentVersion: number };

/** Saves the whole timeline against `version`; a 409 comes back as a conflict, never thrown. */
export async function saveTimeline(lessonId: string, version: number, timeline: Timeline): Promise<SaveOutcome> {
  try {
    const res = await call<TimelineSavedOutput>('PUT', `${lessonPath(lessonId)}/timeline`, { version, segments: timeline.segments, cues: timeline.cues });
    return { ok: true, version: res.version };
  } catch (err) {
    if (err instanceof ApiError && err.status === 409) {
      const body = err.body as { error?: { currentVersion?: number } } | undefined;
      return { ok: false, conflict: true, currentVersion: body?.error?.currentVersion ?? -1 };
    }
    throw err;
  }
}

export async function loadPeaks(url: string): Promise<Peaks> {
  const res = await fetch(url, { credentials: 'same-origin' });
  if (!res.ok) throw new ApiError('The waveform could not be loaded. Reload the page to try again.', res.status, 'peaks');
  return decodePeaks(new Uint8Array(await res.arrayBuffer()));
}

/** "Mark it for me": the proposed timeline (nothing is saved). The API's message explains a 409 or 422. */
export async function requestProposal(lessonId: string): Promise<ProposalOutput> {
  return proposalOutput.parse(await call<unknown>('POST', `${lessonPath(lessonId)}/timeline/propose`, {}));
}

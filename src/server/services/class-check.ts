import { and, eq, inArray } from 'drizzle-orm';
import { lessons, recordings, users } from '~/db/schema';
import type { Plan } from '~/lib/plan/plan-schema';
import { publishGate, type GateInput, type PublishGate } from '~/lib/publishing/publish-gate';
import { checkTiming } from '~/lib/timing/timing-check';
import type { CheckResult } from '~/lib/timing/finding-types';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';
import type { DbOrTx } from '../db';
import { parseStoredPlan } from './lesson-plans';
import { readTimeline, type StoredTimeline } from './timelines';
import { captionsPastEnd } from './captions';

/**
 * The one loader behind the timing check: the check endpoint, the publishing panel and the
 * publish itself all read the class, its plan, its timeline and its media length here, so they
 * always check the same thing the same way.
 */
export interface LoadedClass {
  lesson: typeof lessons.$inferSelect;
  coachName: string;
  plan: Plan | null;
  timeline: StoredTimeline;
  /** The class's current recording (set only once it is ready), or null. */
  recording: { id: string; ready: boolean; durationSeconds: number | null } | null;
  /**
   * Media length for the check: the current recording's measured duration; before a recording
   * is ready, the length stored on the class (seeded demo classes, the editor's own estimate).
   */
  mediaSeconds: number | null;
  /** A newer recording is uploading or being processed (the panel says "wait", not "upload"). */
  recordingInProgress: boolean;
  /** Draft captions ending after the current ready recording (0 without one). */
  captionsPastEnd: number;
}

export async function loadClass(db: DbOrTx, studioId: string, lessonId: string): Promise<LoadedClass> {
  const [row] = await db
    .select({ lesson: lessons, coachName: users.name, recording: { id: recordings.id, state: recordings.state, durationSeconds: recordings.durationSeconds } })
    .from(lessons)
    .innerJoin(users, eq(users.id, lessons.coachId))
    .leftJoin(recordings, eq(recordings.id, lessons.currentRecordingId))
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
  if (!row) throw notFound('That class');
  const rec = row.recording?.id ? row.recording : null;
  const [inProgress] = await db
    .select({ id: recordings.id })
    .from(recordings)
    .where(and(eq(recordings.lessonId, lessonId), inArray(recordings.state, ['uploading', 'processing'])))
    .limit(1);
  const ready = !!rec && rec.state === 'ready' && !!rec.durationSeconds;
  return {
    lesson: row.lesson,
    coachName: row.coachName,
    plan: parseStoredPlan(row.lesson.plan),
    timeline: await readTimeline(db, studioId, lessonId),
    recording: rec ? { id: rec.id, ready, durationSeconds: rec.durationSeconds } : null,
    mediaSeconds: rec?.durationSeconds ?? row.lesson.mediaSeconds,
    recordingInProgress: !!inProgress,
    captionsPastEnd: ready ? await captionsPastEnd(db, lessonId, rec.durationSeconds!) : 0,
  };
}

/** The timing check of a loaded class, or null without a plan to check against. */
export function checkLoaded(loaded: LoadedClass): CheckResult | null {
  if (!loaded.plan) return null;
  return checkTiming(loaded.plan, loaded.timeline, { mediaSeconds: loaded.mediaSeconds, advertisedMinutes: loaded.lesson.advertisedMinutes });
}

/** The check and the publish gate of a loaded class: the same answer for the panel and the publish. */
export function gateLoaded(loaded: LoadedClass): { check: CheckResult | null; gate: PublishGate; gateInput: GateInput } {
  const check = checkLoaded(loaded);
  const gateInput: GateInput = {
    hasPlan: !!loaded.plan,
    recordingReady: !!loaded.recording?.ready,
    recordingInProgress: loaded.recordingInProgress,
    findings: check?.findings ?? [],
    ...(loaded.captionsPastEnd && loaded.recording?.durationSeconds
      ? { captionsPastEnd: { count: loaded.captionsPastEnd, recordingSeconds: loaded.recording.durationSeconds } }
      : {}),
  };
  return { check, gate: publishGate(gateInput), gateInput };
}

/** The check endpoint's answer: the findings and totals for the saved timeline version. */
export async function checkClass(deps: AppDeps, studioId: string, lessonId: string): Promise<CheckResult & { version: number }> {
  const loaded = await loadClass(deps.db, studioId, lessonId);
  const check = checkLoaded(loaded);
  if (!check) throw new AppError('conflict', 'This class has no plan yet. Add its plan, then run the check.');
  return { ...check, version: loaded.timeline.version };
}

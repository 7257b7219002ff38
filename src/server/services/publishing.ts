import { and, desc, eq, inArray, max, sql } from 'drizzle-orm';
import { exercises, lessons, lessonVersions, recordings, users } from '~/db/schema';
import { buildChapters, chaptersToVtt, type Chapter } from '~/lib/publishing/chapters';
import { checkTiming } from '~/lib/timing/timing-check';
import type { Finding } from '~/lib/timing/finding-types';
import type { Segment, Cue } from '~/lib/timeline/timeline-schema';
import type { Plan } from '~/lib/plan/plan-schema';
import { AppError, notFound } from '../http/app-error';
import type { AppDeps } from '../app';
import { libraryChanged } from './library';
import { parseStoredPlan } from './lesson-plans';
import { getTimeline } from './timelines';

/** What a published version holds; members' pages read only this. */
export interface VersionSnapshot {
  details: {
    title: string;
    slug: string;
    description: string;
    advertisedMinutes: number;
    equipment: string[];
    impact: string;
    focus: string[];
    difficulty: string;
    cautions: string;
    coachName: string;
  };
  plan: Plan;
  segments: Segment[];
  cues: Cue[];
  chapters: Chapter[];
  /** The studio's notes for each exercise in the class, as published. */
  exercises: { name: string; cautions: string | null; easierOption: string | null; harderOption: string | null }[];
  check: { errors: number; warnings: number; infos: number; warningMessages: string[] };
}

const count = (findings: Finding[], severity: Finding['severity']) => findings.filter((f) => f.severity === severity).length;

/**
 * Publishes the draft as a new immutable version when the recording is ready and the timing
 * check has no errors; warnings need `acknowledgeWarnings`, which is recorded with the version.
 */
export async function publishLesson(
  deps: AppDeps,
  studioId: string,
  lessonId: string,
  actorId: string | null,
  acknowledgeWarnings: boolean,
): Promise<{ versionId: string; number: number }> {
  const [lesson] = await deps.db
    .select({ lesson: lessons, coachName: users.name })
    .from(lessons)
    .innerJoin(users, eq(users.id, lessons.coachId))
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
  if (!lesson) throw notFound('That class');
  const l = lesson.lesson;
  const plan = parseStoredPlan(l.plan);
  if (!plan) throw new AppError('conflict', 'This class has no plan yet. Add its plan, mark the recording, then publish.');
  const recording = l.currentRecordingId
    ? (await deps.db.select().from(recordings).where(eq(recordings.id, l.currentRecordingId)))[0]
    : undefined;
  if (!recording || recording.state !== 'ready' || !recording.durationSeconds) {
    throw new AppError('conflict', 'The recording is not ready yet. Publish once it has finished processing.');
  }
  const timeline = await getTimeline(deps, studioId, lessonId);
  const check = checkTiming(plan, timeline, { mediaSeconds: recording.durationSeconds, advertisedMinutes: l.advertisedMinutes });
  const errors = check.findings.filter((f) => f.severity === 'error');
  if (errors.length) {
    throw new AppError(
      'conflict',
      `The timing check found ${errors.length} error${errors.length === 1 ? '' : 's'}. Fix ${errors.length === 1 ? 'it' : 'them'} in the timeline, then publish.`,
      undefined,
      { findings: errors },
    );
  }
  const warnings = check.findings.filter((f) => f.severity === 'warning');
  if (warnings.length && !acknowledgeWarnings) {
    throw new AppError(
      'conflict',
      `The timing check has ${warnings.length} warning${warnings.length === 1 ? '' : 's'}. Review ${warnings.length === 1 ? 'it' : 'them'} and confirm to publish anyway.`,
      undefined,
      { needsAcknowledgement: true, findings: warnings },
    );
  }
  const chapters = buildChapters(timeline.segments);
  const names = [...new Set(timeline.segments.flatMap((s) => (s.exercise ? [s.exercise] : [])))];
  const notes = names.length
    ? await deps.db
        .select({ name: exercises.name, cautions: exercises.cautions, easierOption: exercises.easierOption, harderOption: exercises.harderOption })
        .from(exercises)
        .where(and(eq(exercises.studioId, studioId), inArray(sql`lower(${exercises.name})`, names.map((n) => n.toLowerCase()))))
    : [];
  const snapshot: VersionSnapshot = {
    details: {
      title: l.title,
      slug: l.slug,
      description: l.description,
      advertisedMinutes: l.advertisedMinutes,
      equipment: l.equipment,
      impact: l.impact,
      focus: l.focus,
      difficulty: l.difficulty,
      cautions: l.cautions,
      coachName: lesson.coachName,
    },
    plan,
    segments: timeline.segments,
    cues: timeline.cues,
    chapters,
    exercises: notes,
    check: {
      errors: 0,
      warnings: count(check.findings, 'warning'),
      infos: count(check.findings, 'info'),
      warningMessages: warnings.map((w) => w.message),
    },
  };
  const published = await deps.db.transaction(async (tx) => {
    // Lock the class row so two publishes cannot take the same version number.
    await tx.execute(sql`select 1 from ${lessons} where ${lessons.id} = ${lessonId} for update`);
    const [{ last } = { last: 0 }] = await tx
      .select({ last: max(lessonVersions.number) })
      .from(lessonVersions)
      .where(eq(lessonVersions.lessonId, lessonId));
    const number = (last ?? 0) + 1;
    const [version] = await tx
      .insert(lessonVersions)
      .values({
        lessonId,
        number,
        recordingId: recording.id,
        snapshot,
        chaptersVtt: chaptersToVtt(chapters),
        durationSeconds: recording.durationSeconds!,
        warningsAcknowledged: warnings.length > 0 && acknowledgeWarnings,
        publishedBy: actorId,
      })
      .returning({ id: lessonVersions.id, publishedAt: lessonVersions.publishedAt });
    await tx
      .update(lessons)
      .set({
        state: 'published',
        publishedVersionId: version!.id,
        publishedSeconds: recording.durationSeconds!,
        publishedAt: version!.publishedAt,
        searchDocument: [l.title, l.description, ...names, ...l.focus, ...l.equipment].join(' \n'),
        publishAt: null,
        publishScheduledBy: null,
        updatedAt: new Date(),
      })
      .where(eq(lessons.id, lessonId));
    return { versionId: version!.id, number };
  });
  await libraryChanged(deps, studioId);
  return published;
}

/** Schedules a publish; the worker publishes once due (the check runs again then). */
export async function schedulePublish(deps: AppDeps, studioId: string, lessonId: string, actorId: string, at: Date, acknowledgeWarnings: boolean) {
  if (at.getTime() < Date.now() - 60_000) throw new AppError('invalid_input', 'Choose a time in the future.', { publishAt: 'Choose a time in the future.' });
  const updated = await deps.db
    .update(lessons)
    .set({ publishAt: at, publishScheduledBy: actorId, publishAcknowledgesWarnings: acknowledgeWarnings, updatedAt: new Date() })
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)))
    .returning({ id: lessons.id });
  if (!updated.length) throw notFound('That class');
}

/** Takes a class out of the library (draft again) or archives it; versions stay for members' history. */
export async function setLessonState(deps: AppDeps, studioId: string, lessonId: string, state: 'draft' | 'archived') {
  const updated = await deps.db
    .update(lessons)
    .set({ state, publishAt: null, updatedAt: new Date() })
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)))
    .returning({ id: lessons.id });
  if (!updated.length) throw notFound('That class');
  await libraryChanged(deps, studioId);
}

/** Published versions of a class, newest first. */
export async function listVersions(deps: AppDeps, studioId: string, lessonId: string) {
  const [lesson] = await deps.db.select({ id: lessons.id }).from(lessons).where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
  if (!lesson) throw notFound('That class');
  return deps.db
    .select({ id: lessonVersions.id, number: lessonVersions.number, publishedAt: lessonVersions.publishedAt, warningsAcknowledged: lessonVersions.warningsAcknowledged, publishedBy: users.name })
    .from(lessonVersions)
    .leftJoin(users, eq(users.id, lessonVersions.publishedBy))
    .where(eq(lessonVersions.lessonId, lessonId))
    .orderBy(desc(lessonVersions.number));
}

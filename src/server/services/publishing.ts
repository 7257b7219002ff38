import { and, desc, eq, inArray, max, sql } from 'drizzle-orm';
import { exercises, lessons, lessonVersions, users } from '~/db/schema';
import { buildChapters, chaptersToVtt, type Chapter } from '~/lib/publishing/chapters';
import { amrapExercisesBySegment } from '~/lib/timing/amrap-exercises';
import type { CheckResult, Finding } from '~/lib/timing/finding-types';
import type { Segment, Cue } from '~/lib/timeline/timeline-schema';
import type { Plan } from '~/lib/plan/plan-schema';
import type { PublishedCaptions } from '~/lib/captions/caption-schema';
import { notFound } from '../errors';
import type { AppDeps } from '../app';
import type { Tx } from '../db';
import { gateLoaded, loadClass, type LoadedClass } from './class-check';
import { captionsToPublish } from './captions';

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
  /** The captions as published (absent when the class had none, and in versions from before captions). */
  captions?: PublishedCaptions;
}

const count = (findings: readonly Finding[], severity: Finding['severity']) => findings.filter((f) => f.severity === severity).length;

/**
 * Writes a new immutable version of a loaded class and makes it the live one. Runs inside the
 * publish's transaction, after the gate passed on the same loaded state.
 */
export async function writeVersion(
  tx: Tx,
  loaded: LoadedClass & { plan: Plan },
  check: CheckResult,
  actorId: string | null,
  acknowledgeWarnings: boolean,
): Promise<{ versionId: string; number: number }> {
  const { lesson: l, timeline } = loaded;
  const recording = loaded.recording!;
  const amrapExercises = amrapExercisesBySegment(loaded.plan, timeline.segments);
  const chapters = buildChapters(timeline.segments, amrapExercises);
  // The studio's notes (cautions, easier options) for every exercise members do, the ones an AMRAP repeats too.
  const names = [...new Set([...timeline.segments.flatMap((s) => (s.exercise ? [s.exercise] : [])), ...[...amrapExercises.values()].flat()])];
  const notes = names.length
    ? await tx
        .select({ name: exercises.name, cautions: exercises.cautions, easierOption: exercises.easierOption, harderOption: exercises.harderOption })
        .from(exercises)
        .where(and(eq(exercises.studioId, l.studioId), inArray(sql`lower(${exercises.name})`, names.map((n) => n.toLowerCase()))))
    : [];
  const warnings = check.findings.filter((f) => f.severity === 'warning');
  const captions = await captionsToPublish(tx, l.id);
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
      coachName: loaded.coachName,
    },
    plan: loaded.plan,
    segments: timeline.segments,
    cues: timeline.cues,
    chapters,
    exercises: notes,
    check: {
      errors: 0,
      warnings: warnings.length,
      infos: count(check.findings, 'info'),
      warningMessages: warnings.map((w) => w.message),
    },
    ...(captions ? { captions } : {}),
  };
  const [{ last } = { last: 0 }] = await tx
    .select({ last: max(lessonVersions.number) })
    .from(lessonVersions)
    .where(eq(lessonVersions.lessonId, l.id));
  const number = (last ?? 0) + 1;
  const [version] = await tx
    .insert(lessonVersions)
    .values({
      lessonId: l.id,
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
      // Publishing is the review's answer: the class no longer waits in the review list.
      reviewRequestedBy: null,
      reviewRequestedAt: null,
      reviewNote: null,
      publishedSeconds: recording.durationSeconds!,
      publishedAt: version!.publishedAt,
      searchDocument: [l.title, l.description, ...names, ...l.focus, ...l.equipment].join(' \n'),
      publishAt: null,
      publishScheduledBy: null,
      updatedAt: new Date(),
    })
    .where(eq(lessons.id, l.id));
  return { versionId: version!.id, number };
}

/** What the class page's publishing panel needs: the same gate the publish applies, and the versions. */
export async function publishStatus(deps: AppDeps, studioId: string, lessonId: string) {
  const loaded = await loadClass(deps.db, studioId, lessonId);
  const { gate } = gateLoaded(loaded);
  return {
    state: loaded.lesson.state,
    publishAt: loaded.lesson.publishAt,
    blockers: gate.blockers,
    warnings: gate.warnings.map((f) => f.message),
    versions: await listVersions(deps, studioId, lessonId),
  };
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

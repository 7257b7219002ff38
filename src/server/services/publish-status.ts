import { and, eq } from 'drizzle-orm';
import { lessons, recordings } from '~/db/schema';
import { checkTiming } from '~/lib/timing/timing-check';
import type { AppDeps } from '../app';
import { parseStoredPlan } from './lesson-plans';
import { listVersions } from './publishing';
import { getTimeline } from './timelines';

/** What the class page's publishing panel needs: can it publish now, and what stands in the way. */
export async function publishStatus(deps: AppDeps, studioId: string, lessonId: string) {
  const [row] = await deps.db
    .select({ lesson: lessons, recordingState: recordings.state, duration: recordings.durationSeconds })
    .from(lessons)
    .leftJoin(recordings, eq(recordings.id, lessons.currentRecordingId))
    .where(and(eq(lessons.id, lessonId), eq(lessons.studioId, studioId)));
  if (!row) return null;
  const plan = parseStoredPlan(row.lesson.plan);
  const ready = row.recordingState === 'ready';
  let errors = 0;
  let warnings: string[] = [];
  if (plan) {
    const timeline = await getTimeline(deps, studioId, lessonId);
    const check = checkTiming(plan, timeline, { mediaSeconds: row.duration ?? row.lesson.mediaSeconds, advertisedMinutes: row.lesson.advertisedMinutes });
    errors = check.findings.filter((f) => f.severity === 'error').length;
    warnings = check.findings.filter((f) => f.severity === 'warning').map((f) => f.message);
  }
  const blockers = [
    ...(plan ? [] : ['Add the class plan.']),
    ...(ready ? [] : ['Upload the recording and wait until it is ready.']),
    ...(errors ? [`Fix the ${errors} error${errors === 1 ? '' : 's'} the timing check found.`] : []),
  ];
  return {
    state: row.lesson.state,
    publishAt: row.lesson.publishAt,
    blockers,
    warnings,
    versions: await listVersions(deps, studioId, lessonId),
  };
}

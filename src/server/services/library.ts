import { and, desc, eq, isNotNull } from 'drizzle-orm';
import { lessons, users } from '../../db/schema';
import type { AppDeps } from '../app';

/** Published classes of a studio for the member library, newest first. */
export async function publishedLessons(deps: AppDeps, studioId: string, limit = 48) {
  return deps.db
    .select({
      id: lessons.id,
      slug: lessons.slug,
      title: lessons.title,
      description: lessons.description,
      advertisedMinutes: lessons.advertisedMinutes,
      equipment: lessons.equipment,
      impact: lessons.impact,
      focus: lessons.focus,
      difficulty: lessons.difficulty,
      coachName: users.name,
      recordingId: lessons.currentRecordingId,
    })
    .from(lessons)
    .innerJoin(users, eq(users.id, lessons.coachId))
    .where(and(eq(lessons.studioId, studioId), eq(lessons.state, 'published'), isNotNull(lessons.publishedVersionId)))
    .orderBy(desc(lessons.updatedAt))
    .limit(limit);
}

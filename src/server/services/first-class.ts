import { sql } from 'drizzle-orm';
import { lessons, lessonVersions, recordings, segments } from '~/db/schema';
import type { AppDeps } from '../app';

/** How far a new studio is along its first class: each step is done once any class reached it. */
export interface FirstClassProgress {
  planned: boolean;
  uploaded: boolean;
  marked: boolean;
  published: boolean;
}

/** One query over the studio's classes (a new studio has few; the checklist page is the only reader). */
export async function firstClassProgress(deps: AppDeps, studioId: string): Promise<FirstClassProgress> {
  const { rows } = await deps.db.execute<{ planned: boolean; uploaded: boolean; marked: boolean; published: boolean }>(sql`
    select
      exists(select 1 from ${lessons} where ${lessons.studioId} = ${studioId} and ${lessons.plan} is not null) as planned,
      exists(select 1 from ${recordings} r join ${lessons} l on l.id = r.lesson_id where l.studio_id = ${studioId}) as uploaded,
      exists(select 1 from ${segments} s join ${lessons} l on l.id = s.lesson_id where l.studio_id = ${studioId}) as marked,
      exists(select 1 from ${lessonVersions} v join ${lessons} l on l.id = v.lesson_id where l.studio_id = ${studioId}) as published`);
  const row = rows[0]!;
  return { planned: !!row.planned, uploaded: !!row.uploaded, marked: !!row.marked, published: !!row.published };
}

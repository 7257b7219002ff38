import { sql } from 'drizzle-orm';
import type { AppDeps } from '~/server/app';

/**
 * Generates `n` published classes in a new studio with plain SQL (one fake ready recording and
 * one version each), for library query tests and the library benchmark. Values cycle through
 * known patterns so tests can compute expected counts independently of the query code.
 */
export async function generateStudioWithClasses(deps: AppDeps, n: number, slug = `bulk-${Date.now()}`) {
  const result = await deps.db.execute<{ studio_id: string; coach_a: string; coach_b: string }>(sql`
    with studio as (
      insert into studios (slug, name) values (${slug}, 'Bulk Test Studio') returning id
    ), coach_a as (
      insert into users (id, email, name, password_hash) values (${slug + '-a'}, ${slug + '-a@test.example'}, 'Coach A', 'x') returning id
    ), coach_b as (
      insert into users (id, email, name, password_hash) values (${slug + '-b'}, ${slug + '-b@test.example'}, 'Coach B', 'x') returning id
    )
    select (select id from studio) as studio_id, (select id from coach_a) as coach_a, (select id from coach_b) as coach_b`);
  const { studio_id: studioId, coach_a: coachA, coach_b: coachB } = result.rows[0]!;
  await deps.db.execute(sql`
    with l as (
      insert into lessons (studio_id, coach_id, slug, title, description, advertised_minutes, equipment, impact, focus, difficulty,
                           state, published_seconds, search_document)
      select ${studioId}::uuid,
             case when g % 2 = 0 then ${coachA} else ${coachB} end,
             'class-' || g,
             'Class ' || g || case when g % 10 = 0 then ' Kettlebell Flow' else '' end,
             'Generated class number ' || g,
             5 + (g % 12) * 5,
             case when g % 3 = 0 then '{}'::text[] else array['mat'] end,
             (array['low','moderate','high'])[1 + g % 3]::impact_level,
             array[(array['core','full body','mobility','cardio'])[1 + g % 4]],
             (array['beginner','intermediate','advanced'])[1 + g % 3]::difficulty_level,
             'published',
             (5 + (g % 12) * 5) * 60 - 30,
             'Class ' || g || case when g % 10 = 0 then ' Kettlebell Flow swing' else ' squat' end
      from generate_series(1, ${n}) g
      returning id, studio_id
    ), r as (
      insert into recordings (studio_id, lesson_id, state, source_key, file_name, content_type, size_bytes)
      select studio_id, id, 'ready', 'bulk/' || id, 'x.mp4', 'video/mp4', 1 from l
      returning id, lesson_id
    )
    insert into lesson_versions (lesson_id, number, recording_id, snapshot, chapters_vtt, duration_seconds, published_at)
    select r.lesson_id, 1, r.id,
           jsonb_build_object(
             'details', jsonb_build_object('title', 'Generated class', 'slug', 'generated', 'description', '', 'advertisedMinutes', 10,
                                           'equipment', '[]'::jsonb, 'impact', 'low', 'focus', '[]'::jsonb, 'difficulty', 'beginner',
                                           'cautions', '', 'coachName', 'Coach'),
             'plan', '{"blocks": []}'::jsonb, 'segments', '[]'::jsonb, 'cues', '[]'::jsonb, 'chapters', '[]'::jsonb,
             'exercises', '[]'::jsonb, 'check', '{"errors": 0, "warnings": 0, "infos": 0, "warningMessages": []}'::jsonb),
           'WEBVTT', 600, now() - (row_number() over ()) * interval '1 minute' from r`);
  // A separate statement: rows inserted inside a WITH are not visible to the same statement's UPDATE.
  await deps.db.execute(sql`
    update lessons set published_version_id = v.id, current_recording_id = v.recording_id, published_at = v.published_at
    from lesson_versions v where v.lesson_id = lessons.id and lessons.studio_id = ${studioId}::uuid`);
  return { studioId, coachA, coachB };
}

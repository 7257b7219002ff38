// Merging two exercise names, against the real app and PostgreSQL: old classes (plans and marks)
// and studio templates follow the kept name in one transaction; another studio is untouched.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { type ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { createAppDeps } from '~/server/app';
import { exercises, lessons, planTemplates, segments, studios, users } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
let coach: ApiClient;
let editor: ApiClient;
let member: ApiClient;
const suffix = Date.now().toString(36);
// Invented names for this test.
const merged = `Merge burpee ${suffix}`;
const kept = `Merge burpees ${suffix}`;
const other = `Merge squat ${suffix}`;
let otherStudioId = '';
let otherLessonId = '';
let otherExerciseId = '';

const planNaming = (name: string) => ({
  blocks: [
    { kind: 'intervals', exercise: name.toUpperCase(), sets: 2, workSeconds: 20, restSeconds: 10 },
    {
      kind: 'circuit',
      rounds: 2,
      stations: [
        { exercise: name, workSeconds: 20, restSeconds: 10 },
        { exercise: other, workSeconds: 20, restSeconds: 10 },
      ],
    },
  ],
});

beforeAll(async () => {
  [coach, editor, member] = await Promise.all([signedIn(DEMO.coach), signedIn(DEMO.editor), signedIn(DEMO.member)]);
  const [studio] = await deps.db.insert(studios).values({ slug: `merge-other-${suffix}`, name: 'Another Studio' }).returning();
  otherStudioId = studio!.id;
  const [anyUser] = await deps.db.select().from(users).limit(1);
  const [lesson] = await deps.db
    .insert(lessons)
    .values({ studioId: otherStudioId, coachId: anyUser!.id, slug: `merge-theirs-${suffix}`, title: 'Theirs', advertisedMinutes: 10, plan: planNaming(merged) })
    .returning();
  otherLessonId = lesson!.id;
  await deps.db.insert(segments).values({ lessonId: otherLessonId, id: 's1', kind: 'work', startSeconds: 0, endSeconds: 20, exercise: merged });
  const [ex] = await deps.db.insert(exercises).values({ studioId: otherStudioId, name: merged }).returning();
  otherExerciseId = ex!.id;
});
afterAll(async () => {
  await deps.db.delete(studios).where(eq(studios.id, otherStudioId));
  await deps.pool.end();
});

async function createExercise(client: ApiClient, body: Record<string, unknown>) {
  const res = await client.post('/api/exercises', body);
  expect(res.status).toBe(201);
  return (await res.json()) as { id: string; name: string };
}

describe('merging two exercise names', () => {
  it('moves plans, marks and templates to the kept name in one go; the other studio keeps its own', async () => {
    const from = await createExercise(editor, { name: merged, cautions: 'Land softly; step back instead of jumping if your knees complain.', easierOption: 'Step back, no jump' });
    const into = await createExercise(editor, { name: kept, harderOption: 'Add a tuck jump' });
    await createExercise(editor, { name: other });

    const created = await (await coach.post('/api/lessons', { title: `Merge class ${suffix}`, advertisedMinutes: 10 })).json();
    const put = await coach.put(`/api/lessons/${created.id}/plan`, { version: created.version, ...planNaming(merged) });
    expect(put.status).toBe(200);
    const planVersion = (await put.json()).version as number;
    // Marks naming the merged move (written straight to the table: this class has no recording).
    await deps.db.insert(segments).values([
      { lessonId: created.id, id: 'a', kind: 'work', startSeconds: 0, endSeconds: 20, exercise: merged.toLowerCase() },
      { lessonId: created.id, id: 'b', kind: 'work', startSeconds: 30, endSeconds: 50, exercise: other },
    ]);
    const [before] = await deps.db.select({ timelineVersion: lessons.timelineVersion }).from(lessons).where(eq(lessons.id, created.id));
    const untouched = await (await coach.post('/api/lessons', { title: `Merge bystander ${suffix}`, advertisedMinutes: 10 })).json();
    const bystander = await coach.put(`/api/lessons/${untouched.id}/plan`, { version: untouched.version, blocks: [{ kind: 'intervals', exercise: other, sets: 1, workSeconds: 20, restSeconds: 10 }] });
    const bystanderVersion = (await bystander.json()).version as number;
    expect((await coach.post('/api/plan-templates', { name: `Merge template ${suffix}`, plan: planNaming(merged) })).status).toBe(201);

    const usage = await editor.get(`/api/exercises/${from.id}/usage`);
    expect(usage.status).toBe(200);
    const used = await usage.json();
    expect(used.classes.map((c: { title: string }) => c.title)).toEqual([`Merge class ${suffix}`]);
    expect(used.templates.map((t: { name: string }) => t.name)).toEqual([`Merge template ${suffix}`]);

    const res = await editor.post('/api/exercises/merge', { fromId: from.id, intoId: into.id });
    expect(res.status).toBe(200);
    const result = await res.json();
    expect(result).toMatchObject({ mergedName: merged, classesChanged: 1, templatesChanged: 1 });
    // Blank details of the kept exercise take the merged one's; its own stay.
    expect(result.kept).toMatchObject({ name: kept, cautions: 'Land softly; step back instead of jumping if your knees complain.', easierOption: 'Step back, no jump', harderOption: 'Add a tuck jump' });

    const plan = await (await coach.get(`/api/lessons/${created.id}/plan`)).json();
    expect(plan.plan.blocks[0].exercise).toBe(kept);
    expect(plan.plan.blocks[1].stations.map((s: { exercise: string }) => s.exercise)).toEqual([kept, other]);
    expect(plan.version).toBe(planVersion + 1);
    const marks = await deps.db.select().from(segments).where(eq(segments.lessonId, created.id)).orderBy(segments.id);
    expect(marks.map((m) => m.exercise)).toEqual([kept, other]);
    const [after] = await deps.db.select({ timelineVersion: lessons.timelineVersion }).from(lessons).where(eq(lessons.id, created.id));
    expect(after!.timelineVersion).toBe(before!.timelineVersion + 1);
    expect((await (await coach.get(`/api/lessons/${untouched.id}/plan`)).json()).version).toBe(bystanderVersion);
    const [template] = await deps.db.select().from(planTemplates).where(eq(planTemplates.name, `Merge template ${suffix}`));
    expect(JSON.stringify(template!.plan)).not.toContain(merged);
    expect(JSON.stringify(template!.plan)).toContain(kept);
    const names = ((await (await editor.get('/api/exercises')).json()).exercises as { name: string }[]).map((e) => e.name);
    expect(names).toContain(kept);
    expect(names).not.toContain(merged);

    // A plan editor still holding the version from before the merge cannot write the old name back.
    const stale = await coach.put(`/api/lessons/${created.id}/plan`, { version: planVersion, ...planNaming(merged) });
    expect(stale.status).toBe(409);

    // The other studio's class, marks and exercise of the same name are untouched.
    const [theirs] = await deps.db.select().from(lessons).where(eq(lessons.id, otherLessonId));
    expect(JSON.stringify(theirs!.plan)).toContain(merged);
    expect(theirs!.version).toBe(1);
    const [theirMark] = await deps.db.select().from(segments).where(eq(segments.lessonId, otherLessonId));
    expect(theirMark!.exercise).toBe(merged);
    expect(await deps.db.select().from(exercises).where(and(eq(exercises.studioId, otherStudioId), eq(exercises.name, merged)))).toHaveLength(1);
  });

  it('refuses a merge of a name with itself, another studio’s exercise, and people who are not staff; nothing changes', async () => {
    const a = await createExercise(coach, { name: `Merge lunge ${suffix}` });
    const b = await createExercise(coach, { name: `Merge lunges ${suffix}` });
    const same = await coach.post('/api/exercises/merge', { fromId: a.id, intoId: a.id });
    expect(same.status).toBe(400);
    expect((await same.json()).error.fields.intoId).toBe('Choose two different names: one to keep and one to merge into it.');
    const notOurs = await coach.post('/api/exercises/merge', { fromId: otherExerciseId, intoId: a.id });
    expect(notOurs.status).toBe(404);
    expect((await coach.get(`/api/exercises/${otherExerciseId}/usage`)).status).toBe(404);
    const byMember = await member.post('/api/exercises/merge', { fromId: a.id, intoId: b.id });
    expect(byMember.status).toBe(403);
    const bad = await coach.post('/api/exercises/merge', { fromId: 'nope', intoId: b.id });
    expect(bad.status).toBe(400);
    const names = ((await (await coach.get('/api/exercises')).json()).exercises as { name: string }[]).map((e) => e.name);
    expect(names).toEqual(expect.arrayContaining([a.name, b.name]));
    expect(await deps.db.select().from(exercises).where(eq(exercises.id, otherExerciseId))).toHaveLength(1);
  });
});

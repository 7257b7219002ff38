// Plan templates and copying a plan between classes, against the real app and PostgreSQL.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { type ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { createAppDeps } from '~/server/app';
import { evenStations } from '~/lib/plan/even-stations';
import { lessons, planTemplates, studios, users } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
let coach: ApiClient;
let editor: ApiClient;
let member: ApiClient;
let otherStudioId = '';
let otherLessonId = '';
const suffix = Date.now().toString(36);

// A ladder: work 30/40/50 s per round at two stations, 20 s rests, 60 s round break.
const ladderPlan = {
  blocks: [
    { kind: 'warmup', seconds: 240 },
    {
      kind: 'circuit',
      rounds: 3,
      roundBreakSeconds: 60,
      stations: evenStations(['Template squat', 'Template row'], 30, 20),
      roundChanges: [{ round: 2, workSeconds: 40 }, { round: 3, workSeconds: 50 }],
    },
  ],
};

beforeAll(async () => {
  [coach, editor, member] = await Promise.all([signedIn(DEMO.coach), signedIn(DEMO.editor), signedIn(DEMO.member)]);
  const [other] = await deps.db.insert(studios).values({ slug: `tpl-other-${suffix}`, name: 'Another Studio' }).returning();
  otherStudioId = other!.id;
  const [anyUser] = await deps.db.select().from(users).limit(1);
  const [lesson] = await deps.db
    .insert(lessons)
    .values({ studioId: other!.id, coachId: anyUser!.id, slug: `tpl-secret-${suffix}`, title: 'Secret', advertisedMinutes: 20, plan: ladderPlan })
    .returning();
  otherLessonId = lesson!.id;
  await deps.db.insert(planTemplates).values({ studioId: other!.id, name: 'Their secret template', plan: ladderPlan });
});
afterAll(async () => {
  await deps.db.delete(studios).where(eq(studios.id, otherStudioId));
  await deps.pool.end();
});

describe('plan templates', () => {
  it('lists the built-in formats; the Tabata one adds up to 240 s once its move is named', async () => {
    const res = await coach.get('/api/plan-templates');
    expect(res.status).toBe(200);
    const { templates } = await res.json();
    expect(templates.filter((t: { builtIn: boolean }) => t.builtIn).map((t: { id: string }) => t.id)).toEqual(['tabata', 'six-station-circuit', 'ladder', 'emom-10', 'amrap-12']);
    expect(templates.map((t: { name: string }) => t.name)).not.toContain('Their secret template');
    const tabata = templates.find((t: { id: string }) => t.id === 'tabata').plan;
    tabata.blocks[0].exercise = 'Template burpee';
    const lesson = await (await coach.post('/api/lessons', { title: `Template Tabata ${suffix}`, advertisedMinutes: 4 })).json();
    const put = await coach.put(`/api/lessons/${lesson.id}/plan`, { version: lesson.version, ...tabata });
    expect(put.status).toBe(200);
    // Tabata I. et al., Med Sci Sports Exerc 1996;28(10):1327–1330: 8 × (20 s + 10 s) = 240 s.
    expect((await put.json()).schedule.totals.classSeconds).toBe(240);
  });

  it('saves a plan as a studio template, refuses a second one of the same name (any case) and a bad plan', async () => {
    const created = await editor.post('/api/plan-templates', { name: `Ladder ${suffix}`, plan: ladderPlan });
    expect(created.status).toBe(201);
    const body = await created.json();
    expect(body).toMatchObject({ name: `Ladder ${suffix}`, builtIn: false });
    const again = await coach.post('/api/plan-templates', { name: `LADDER ${suffix}`, plan: ladderPlan });
    expect(again.status).toBe(409);
    expect((await again.json()).error.fields.name).toBe('A template with this name already exists.');
    const bad = await coach.post('/api/plan-templates', { name: `Broken ${suffix}`, plan: { blocks: [{ kind: 'circuit', rounds: 2, stations: [{ exercise: 'X', workSeconds: 30, restSeconds: 0 }], roundChanges: [{ round: 3, workSeconds: 10 }] }] } });
    expect(bad.status).toBe(400);
    expect((await bad.json()).error.fields['plan.blocks.0.roundChanges.0.round']).toBe("Round 3 is past the circuit's 2 rounds.");
    const noName = await coach.post('/api/plan-templates', { name: '  ', plan: ladderPlan });
    expect(noName.status).toBe(400);
    expect((await noName.json()).error.fields.name).toBe('The template needs a name.');
    const rows = await deps.db.select().from(planTemplates).where(eq(planTemplates.name, `Broken ${suffix}`));
    expect(rows).toHaveLength(0);
    // Members cannot read or write templates.
    expect((await member.get('/api/plan-templates')).status).toBe(403);
    expect((await member.post('/api/plan-templates', { name: `M ${suffix}`, plan: ladderPlan })).status).toBe(403);
  });

  it('a class started from the saved template gets its plan, ladder arithmetic included', async () => {
    const { templates } = await (await coach.get('/api/plan-templates')).json();
    const mine = templates.find((t: { name: string }) => t.name === `Ladder ${suffix}`);
    const lesson = await (await coach.post('/api/lessons', { title: `From template ${suffix}`, advertisedMinutes: 10 })).json();
    const put = await coach.put(`/api/lessons/${lesson.id}/plan`, { version: lesson.version, ...mine.plan });
    expect(put.status).toBe(200);
    const view = await put.json();
    // Worked by hand: warm-up 240; round 1: 30 + 20 + 30 = 80 (round break replaces the last rest) + 60 break;
    // round 2: 40 + 20 + 40 = 100 + 60 break; round 3: 50 + 20 + 50 = 120 (final rest dropped).
    // 240 + 140 + 160 + 120 = 660 s.
    expect(view.schedule.totals.classSeconds).toBe(660);
    expect(view.schedule.totals.workSeconds).toBe(2 * (30 + 40 + 50));
  });

  it('copies the plan of an earlier class of the studio, and never one of another studio', async () => {
    const { lessons: list } = await (await coach.get('/api/lessons')).json();
    const source = list.find((l: { slug: string }) => l.slug === 'lunch-hour-ladder');
    const from = await (await coach.get(`/api/lessons/${source.id}/plan`)).json();
    expect(from.plan).not.toBeNull();
    const target = await (await coach.post('/api/lessons', { title: `Copy ${suffix}`, advertisedMinutes: 30 })).json();
    const put = await coach.put(`/api/lessons/${target.id}/plan`, { version: target.version, ...from.plan });
    expect(put.status).toBe(200);
    const copied = await (await coach.get(`/api/lessons/${target.id}/plan`)).json();
    expect(copied.plan).toEqual(from.plan);
    expect(copied.schedule.totals).toEqual(from.schedule.totals);
    expect((await coach.get(`/api/lessons/${otherLessonId}/plan`)).status).toBe(404);
  });
});

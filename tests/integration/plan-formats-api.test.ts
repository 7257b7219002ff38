/**
 * A plan with every kind of block (a per-side station, an AMRAP and an EMOM among them) saved
 * and checked through the API: the timeline keeps each mark's side and format, the check
 * answers clean for exact marks and reports the EMOM minute a late mark breaks. Plans and
 * names are invented for the test.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { type ApiClient, DEMO, signedIn } from '../helpers/api-client';

let coach: ApiClient;
let lessonId = '';

// Worked by hand (default options: the last station's rest and the final rest are dropped):
// warm-up 0–60; circuit (1 round): Squat 60–90, rest 90–100, Side lunge left 100–120, switch
// 120–125, right 125–145; intervals 2 × 20/10 without the last rest: 145–165, 165–175, 175–195;
// AMRAP 195–495 (5:00); EMOM 3 × (30 s work + 30 s rest) 495–675 (tops at 495, 555, 615); talk
// 675–705; cool-down 705–765. Class 765 s.
const allKinds = {
  blocks: [
    { kind: 'warmup', seconds: 60 },
    {
      kind: 'circuit',
      rounds: 1,
      stations: [
        { exercise: 'Formats squat', workSeconds: 30, restSeconds: 10 },
        { exercise: 'Formats side lunge', workSeconds: 20, restSeconds: 10, perSide: true, switchSeconds: 5 },
      ],
    },
    { kind: 'intervals', exercise: 'Formats skater', sets: 2, workSeconds: 20, restSeconds: 10 },
    { kind: 'amrap', seconds: 300, exercises: ['Formats burpee', 'Formats air squat'] },
    { kind: 'emom', minutes: 3, workSeconds: 30, exercises: ['Formats swing'] },
    { kind: 'talk', seconds: 30 },
    { kind: 'cooldown', seconds: 60 },
  ],
};

/** The marks a coach would lay down for the plan above, exactly on plan. */
function exactTimeline() {
  const seg = (id: string, kind: string, startSeconds: number, endSeconds: number, extra: Record<string, unknown> = {}) => ({ id, kind, startSeconds, endSeconds, ...extra });
  return {
    segments: [
      seg('wu', 'warmup', 0, 60),
      seg('sq', 'work', 60, 90, { exercise: 'Formats squat', round: 1 }),
      seg('sqr', 'rest', 90, 100, { round: 1 }),
      seg('sl', 'work', 100, 120, { exercise: 'Formats side lunge', round: 1, side: 'left' }),
      seg('sw', 'rest', 120, 125, { round: 1, side: 'left' }),
      seg('sr', 'work', 125, 145, { exercise: 'Formats side lunge', round: 1, side: 'right' }),
      seg('k1', 'work', 145, 165, { exercise: 'Formats skater', set: 1 }),
      seg('k1r', 'rest', 165, 175, { set: 1 }),
      seg('k2', 'work', 175, 195, { exercise: 'Formats skater', set: 2 }),
      seg('am', 'work', 195, 495, { format: 'amrap' }),
      seg('e1', 'work', 495, 525, { exercise: 'Formats swing', round: 1, format: 'emom' }),
      seg('e1r', 'rest', 525, 555, { round: 1, format: 'emom' }),
      seg('e2', 'work', 555, 585, { exercise: 'Formats swing', round: 2, format: 'emom' }),
      seg('e2r', 'rest', 585, 615, { round: 2, format: 'emom' }),
      seg('e3', 'work', 615, 645, { exercise: 'Formats swing', round: 3, format: 'emom' }),
      seg('e3r', 'rest', 645, 675, { round: 3, format: 'emom' }),
      seg('tk', 'talk', 675, 705),
      seg('cd', 'cooldown', 705, 765),
    ],
    cues: [],
  };
}

beforeAll(async () => {
  coach = await signedIn(DEMO.coach);
  const res = await coach.post('/api/lessons', { title: 'Every format API check', advertisedMinutes: 13, mediaSeconds: 770 });
  expect(res.status).toBe(201);
  lessonId = (await res.json()).id;
});

describe('a plan with every kind of block', () => {
  it('is saved, expanded as worked by hand, and its exercises join the studio list', async () => {
    const { version } = await (await coach.get(`/api/lessons/${lessonId}/plan`)).json();
    const put = await coach.put(`/api/lessons/${lessonId}/plan`, { version, ...allKinds });
    expect(put.status).toBe(200);
    expect((await put.json()).addedExercises).toEqual(
      expect.arrayContaining(['Formats side lunge', 'Formats burpee', 'Formats air squat', 'Formats swing']),
    );
    const got = await (await coach.get(`/api/lessons/${lessonId}/plan`)).json();
    expect(got.schedule.totals.classSeconds).toBe(765);
    const sides = got.schedule.segments.filter((s: { side?: string; kind: string }) => s.kind === 'work' && s.side).map((s: { side: string; startSeconds: number }) => [s.side, s.startSeconds]);
    expect(sides).toEqual([['left', 100], ['right', 125]]);
    const emomTops = got.schedule.segments.filter((s: { blockKind: string; kind: string }) => s.blockKind === 'emom' && s.kind === 'work').map((s: { startSeconds: number }) => s.startSeconds);
    expect(emomTops).toEqual([495, 555, 615]);
  });

  it('refuses an EMOM whose work fills the minute, with the message at the field, and keeps the saved plan', async () => {
    const { version } = await (await coach.get(`/api/lessons/${lessonId}/plan`)).json();
    const res = await coach.put(`/api/lessons/${lessonId}/plan`, { version, blocks: [{ kind: 'emom', minutes: 10, workSeconds: 60, exercises: ['Formats swing'] }] });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(error.fields['blocks.0.workSeconds']).toBe('Work must be less than 60 seconds: what is left of the minute is the rest.');
    const got = await (await coach.get(`/api/lessons/${lessonId}/plan`)).json();
    expect(got.plan.blocks).toHaveLength(7);
  });

  it('a timeline with sides and formats is stored as sent and checks clean', async () => {
    const { version } = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    const put = await coach.put(`/api/lessons/${lessonId}/timeline`, { version, ...exactTimeline() });
    expect(put.status).toBe(200);
    const back = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    expect(back.segments.find((s: { id: string }) => s.id === 'sl')).toMatchObject({ side: 'left', exercise: 'Formats side lunge' });
    expect(back.segments.find((s: { id: string }) => s.id === 'am')).toMatchObject({ format: 'amrap' });
    const check = await (await coach.post(`/api/lessons/${lessonId}/check`)).json();
    expect(check.findings).toEqual([]);
    expect(check.ok).toBe(true);
  });

  it('a late EMOM minute and a mark on the wrong side are reported through the API', async () => {
    const t = exactTimeline();
    // Minute 2 marked 4 s late (the rest of minute 1 runs on); the right side marked "left".
    for (const s of t.segments) {
      if (s.id === 'e1r') s.endSeconds = 559;
      if (s.id === 'e2') s.startSeconds = 559;
      if (s.id === 'sr') Object.assign(s, { side: 'left' });
    }
    const { version } = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    expect((await coach.put(`/api/lessons/${lessonId}/timeline`, { version, ...t })).status).toBe(200);
    const check = await (await coach.post(`/api/lessons/${lessonId}/check`)).json();
    const minute = check.findings.find((f: { code: string }) => f.code === 'emom-minute');
    expect(minute).toMatchObject({ severity: 'error', segmentIds: ['e2'] });
    expect(minute.message).toContain('Minute 2 of 3');
    expect(minute.fix).toEqual([
      { segmentId: 'e1r', field: 'endSeconds', value: 555 },
      { segmentId: 'e2', field: 'startSeconds', value: 555 },
    ]);
    expect(check.findings.some((f: { message: string }) => f.message.includes('Formats side lunge, right side'))).toBe(true);
  });

  it('refuses a segment side that is neither left nor right, and stores nothing', async () => {
    const { version } = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    const t = exactTimeline();
    Object.assign(t.segments[3]!, { side: 'both' });
    const res = await coach.put(`/api/lessons/${lessonId}/timeline`, { version, ...t });
    expect(res.status).toBe(400);
    expect((await res.json()).error.fields['segments.3.side']).toBe('The side must be left or right.');
    expect((await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json()).version).toBe(version);
  });
});

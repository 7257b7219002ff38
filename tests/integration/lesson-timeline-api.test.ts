import { beforeAll, describe, expect, it } from 'vitest';
import { type ApiClient, DEMO, signedIn } from '../helpers/api-client';

let coach: ApiClient;
let editor: ApiClient;
let member: ApiClient;
let lessonId = '';

// Tabata protocol: 8 × (20 s work + 10 s rest) = 240 s
// (Tabata I. et al., Med Sci Sports Exerc 1996;28(10):1327–1330). dropFinalRest: false keeps the 8th rest.
const tabataPlan = {
  blocks: [{ kind: 'intervals', exercise: 'Tabata test move', sets: 8, workSeconds: 20, restSeconds: 10 }],
  options: { dropFinalRest: false },
};

/** A correct timeline for the Tabata plan: work/rest from 0 s. */
function tabataTimeline() {
  const segments = [];
  for (let set = 1; set <= 8; set++) {
    const t = (set - 1) * 30;
    segments.push({ id: `w${set}`, kind: 'work', startSeconds: t, endSeconds: t + 20, exercise: 'Tabata test move', set });
    segments.push({ id: `r${set}`, kind: 'rest', startSeconds: t + 20, endSeconds: t + 30, set });
  }
  return { segments, cues: [{ id: 'c1', atSeconds: 17, kind: 'countdown', text: '3, 2, 1' }] };
}

beforeAll(async () => {
  [coach, editor, member] = await Promise.all([signedIn(DEMO.coach), signedIn(DEMO.editor), signedIn(DEMO.member)]);
  const res = await coach.post('/api/lessons', { title: 'Tabata API check', advertisedMinutes: 4, mediaSeconds: 250 });
  expect(res.status).toBe(201);
  lessonId = (await res.json()).id;
});

describe('plan', () => {
  it('stores a plan, expands it, and adds new exercise names to the studio list', async () => {
    const before = await (await coach.get(`/api/lessons/${lessonId}/plan`)).json();
    expect(before.plan).toBeNull();
    const put = await coach.put(`/api/lessons/${lessonId}/plan`, { version: before.version, ...tabataPlan });
    expect(put.status).toBe(200);
    const body = await put.json();
    expect(body.version).toBe(before.version + 1);
    expect(body.addedExercises).toEqual(['Tabata test move']);
    const got = await (await coach.get(`/api/lessons/${lessonId}/plan`)).json();
    expect(got.schedule.totals.classSeconds).toBe(240); // Tabata 1996: 8 × 30 s
    expect(got.schedule.totals.workSeconds).toBe(160);
    expect(got.schedule.segments).toHaveLength(16);
    const list = await (await coach.get('/api/exercises')).json();
    expect(list.exercises.map((e: { name: string }) => e.name)).toContain('Tabata test move');
  });

  it('refuses a malformed plan and names the field', async () => {
    const { version } = await (await coach.get(`/api/lessons/${lessonId}/plan`)).json();
    const res = await coach.put(`/api/lessons/${lessonId}/plan`, { version, blocks: [{ kind: 'circuit', rounds: 0, stations: [] }] });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(Object.keys(error.fields).some((k) => k.startsWith('blocks.0'))).toBe(true);
    expect(error.fields['blocks.0.rounds']).toBe('A circuit needs at least 1 round.');
  });

  it('refuses a stale plan save with 409 and the current version, and keeps the newer plan', async () => {
    const read = await (await coach.get(`/api/lessons/${lessonId}/plan`)).json();
    // The editor saves first, from the same version the coach read.
    const first = await editor.put(`/api/lessons/${lessonId}/plan`, { version: read.version, ...tabataPlan, options: { dropFinalRest: true } });
    expect(first.status).toBe(200);
    const stale = await coach.put(`/api/lessons/${lessonId}/plan`, { version: read.version, blocks: [{ kind: 'warmup', seconds: 60 }] });
    expect(stale.status).toBe(409);
    const { error } = await stale.json();
    expect(error.code).toBe('conflict');
    expect(error.currentVersion).toBe(read.version + 1);
    const after = await (await coach.get(`/api/lessons/${lessonId}/plan`)).json();
    expect(after.version).toBe(read.version + 1);
    expect(after.plan.blocks[0].kind).toBe('intervals');
    expect(after.plan.options.dropFinalRest).toBe(true);
    // A save without a version is refused too: every plan write is versioned.
    const unversioned = await coach.put(`/api/lessons/${lessonId}/plan`, tabataPlan);
    expect(unversioned.status).toBe(400);
    // Put the Tabata plan back (with the final rest) for the tests below.
    const back = await coach.put(`/api/lessons/${lessonId}/plan`, { version: after.version, ...tabataPlan });
    expect(back.status).toBe(200);
  });
});

describe('timeline and check', () => {
  it('starts at version 0, saves, and checks clean', async () => {
    const empty = await (await editor.get(`/api/lessons/${lessonId}/timeline`)).json();
    expect(empty).toEqual({ version: 0, segments: [], cues: [] });
    const saved = await editor.put(`/api/lessons/${lessonId}/timeline`, { version: 0, ...tabataTimeline() });
    expect(saved.status).toBe(200);
    expect(await saved.json()).toEqual({ version: 1 });
    const check = await (await editor.post(`/api/lessons/${lessonId}/check`)).json();
    expect(check.findings.filter((f: { severity: string }) => f.severity === 'error')).toEqual([]);
    expect(check.ok).toBe(true);
  });

  it('answers a stale save with 409 and the current version, and changes nothing', async () => {
    const current = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    const t = tabataTimeline();
    t.segments[0]!.endSeconds = 25;
    const first = await coach.put(`/api/lessons/${lessonId}/timeline`, { version: current.version, ...t });
    expect(first.status).toBe(200);
    const stale = await editor.put(`/api/lessons/${lessonId}/timeline`, { version: current.version, segments: [], cues: [] });
    expect(stale.status).toBe(409);
    expect((await stale.json()).error.currentVersion).toBe(current.version + 1);
    const after = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    expect(after.segments).toHaveLength(16);
    expect(after.segments.find((s: { id: string }) => s.id === 'w1').endSeconds).toBe(25);
  });

  it('flags the 25 s first work interval and the overlap it makes with the rest', async () => {
    const check = await (await coach.post(`/api/lessons/${lessonId}/check`)).json();
    const codes = check.findings.map((f: { code: string }) => f.code);
    expect(codes).toContain('work-too-long');
    expect(codes).toContain('overlap');
    expect(check.ok).toBe(false);
  });

  it('refuses overlapping ids and a segment that ends before it starts, saving nothing', async () => {
    const current = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    const res = await coach.put(`/api/lessons/${lessonId}/timeline`, {
      version: current.version,
      segments: [
        { id: 'a', kind: 'work', startSeconds: 10, endSeconds: 5 },
        { id: 'a', kind: 'rest', startSeconds: 20, endSeconds: 30 },
      ],
      cues: [],
    });
    expect(res.status).toBe(400);
    expect((await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json()).version).toBe(current.version);
  });
});

describe('import and export', () => {
  it('will not write overlapping chapters as WebVTT, and says why', async () => {
    // The timeline still has the overlap from above; W3C WebVTT §4.5.1 nests chapters, never overlaps them.
    const res = await coach.get(`/api/lessons/${lessonId}/timeline/export?format=vtt`);
    expect(res.status).toBe(409);
    expect((await res.json()).error.message).toMatch(/cannot be written as WebVTT/);
  });

  it('round-trips through CSV and WebVTT keeping every time to the millisecond', async () => {
    const clean = tabataTimeline();
    clean.segments[3]!.startSeconds = 50.123; // a time with milliseconds (rest 2 starts later)
    const v = (await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json()).version;
    expect((await coach.put(`/api/lessons/${lessonId}/timeline`, { version: v, ...clean })).status).toBe(200);
    const before = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    for (const format of ['csv', 'vtt'] as const) {
      const exported = await coach.get(`/api/lessons/${lessonId}/timeline/export?format=${format}`);
      expect(exported.status).toBe(200);
      expect(exported.headers.get('content-type')).toContain(format === 'csv' ? 'text/csv' : 'text/vtt');
      const text = await exported.text();
      if (format === 'vtt') expect(text.startsWith('WEBVTT')).toBe(true); // W3C WebVTT §4.1: file starts with WEBVTT
      const current = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
      const imported = await coach.request('POST', `/api/lessons/${lessonId}/timeline/import?version=${current.version}`, text);
      expect(imported.status, await imported.clone().text()).toBe(200);
      const after = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
      const times = (t: typeof before) =>
        t.segments.map((s: { id: string; startSeconds: number; endSeconds: number }) => [s.id, s.startSeconds, s.endSeconds]).sort();
      expect(times(after)).toEqual(times(before));
    }
  });

  it('neutralises spreadsheet formulas in the CSV export and reads them back as written (OWASP "CSV Injection")', async () => {
    const base = tabataTimeline();
    const timeline = { segments: base.segments.map((seg, i) => (i === 0 ? { ...seg, title: '@SUM(1+1)' } : seg)), cues: [] as unknown[] };
    timeline.cues = [{ id: 'f1', atSeconds: 1, kind: 'note', text: '=HYPERLINK("http://evil.example","Form tips")' }];
    const v = (await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json()).version;
    expect((await coach.put(`/api/lessons/${lessonId}/timeline`, { version: v, ...timeline })).status).toBe(200);
    const csv = await (await coach.get(`/api/lessons/${lessonId}/timeline/export?format=csv`)).text();
    expect(csv).toContain(`"'=HYPERLINK(""http://evil.example"",""Form tips"")"`);
    expect(csv).toContain(`'@SUM(1+1)`);
    // No cell starts with a formula character (cells split naively: none of these holds a comma).
    for (const line of csv.trim().split('\r\n')) for (const cell of line.split(',')) expect(cell.replace(/^"/, '')).not.toMatch(/^[=+\-@\t\r]/);
    const current = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    expect((await coach.request('POST', `/api/lessons/${lessonId}/timeline/import?version=${current.version}&format=csv`, csv)).status).toBe(200);
    const after = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    expect(after.cues[0].text).toBe('=HYPERLINK("http://evil.example","Form tips")');
    expect(after.segments.find((s: { id: string }) => s.id === timeline.segments[0]!.id).title).toBe('@SUM(1+1)');
  });

  it('names the line of a bad CSV row and imports nothing', async () => {
    const current = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    const csv = 'type,id,kind,start,end,exercise,round,set,title,text\nsegment,x1,work,0:00.000,0:20.000,,,,,\nsegment,x2,jog,0:20.000,0:30.000,,,,,\n';
    const res = await coach.request('POST', `/api/lessons/${lessonId}/timeline/import?version=${current.version}&format=csv`, csv);
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(error.errors[0].line).toBe(3);
    expect(error.message).toMatch(/^Nothing was imported: line 3:/);
    expect((await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json()).version).toBe(current.version);
  });

  it('names the line of a bad WebVTT timestamp', async () => {
    const current = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    // W3C WebVTT §4.1: seconds must be 00–59, so 00:61.000 is not a valid timestamp.
    const vtt = 'WEBVTT\n\n00:00.000 --> 00:20.000\nWork\n\n00:20.000 --> 00:61.000\nRest\n';
    const res = await coach.request('POST', `/api/lessons/${lessonId}/timeline/import?version=${current.version}&format=vtt`, vtt);
    expect(res.status).toBe(400);
    expect((await res.json()).error.errors[0].line).toBe(6);
  });

  it('refuses an import past the save limits (5,000 segments, 20,000 cues) and changes nothing', async () => {
    const current = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    // Invented rows: 5,001 one-second work segments, then 20,001 cues.
    const segmentRows = Array.from({ length: 5001 }, (_, i) => `segment,,work,${i},${i + 1},,,,,`);
    const tooManySegments = ['type,id,kind,start,end,exercise,round,set,title,text', ...segmentRows].join('\n');
    const res = await coach.request('POST', `/api/lessons/${lessonId}/timeline/import?version=${current.version}&format=csv`, tooManySegments, { 'content-type': 'text/csv' });
    expect(res.status).toBe(400);
    expect((await res.json()).error.message).toBe('Nothing was imported: The file has 5001 segments; a timeline holds at most 5000, as when saving. Split the class or merge segments.');
    const cueRows = Array.from({ length: 20_001 }, (_, i) => `cue,,note,${i / 10},,,,,,n`);
    const tooManyCues = ['type,id,kind,start,end,exercise,round,set,title,text', 'segment,,work,0,20,,,,,', ...cueRows].join('\n');
    const cues = await coach.request('POST', `/api/lessons/${lessonId}/timeline/import?version=${current.version}&format=csv`, tooManyCues, { 'content-type': 'text/csv' });
    expect(cues.status).toBe(400);
    expect((await cues.json()).error.message).toMatch(/The file has 20001 cues; a timeline holds at most 20000/);
    expect((await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json()).version).toBe(current.version);
  });

  it.each([
    ['an empty file', '', 'csv', /The file is empty/],
    ['a CSV with only its header row', 'type,id,kind,start,end,exercise,round,set,title,text\n', 'csv', /The file has no segments, so importing it would empty the timeline/],
    ['a CSV with cues only', 'type,id,kind,start,end,exercise,round,set,title,text\ncue,,note,1,,,,,,Breathe\n', 'csv', /The file has no segments/],
    ['a WebVTT file without cues', 'WEBVTT\n\n', 'vtt', /The file has no segments/],
  ])('refuses %s instead of emptying the timeline', async (_what, text, format, message) => {
    const before = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    expect(before.segments.length).toBeGreaterThan(0);
    const res = await coach.request('POST', `/api/lessons/${lessonId}/timeline/import?version=${before.version}&format=${format}`, text || ' ', { 'content-type': 'text/plain' });
    expect(res.status).toBe(400);
    expect((await res.json()).error.message).toMatch(message);
    const after = await (await coach.get(`/api/lessons/${lessonId}/timeline`)).json();
    expect(after.version).toBe(before.version);
    expect(after.segments).toHaveLength(before.segments.length);
  });

  it('refuses an import without a version, and a stale one', async () => {
    expect((await coach.request('POST', `/api/lessons/${lessonId}/timeline/import`, 'WEBVTT\n')).status).toBe(400);
    const stale = await coach.request('POST', `/api/lessons/${lessonId}/timeline/import?version=0`, 'WEBVTT\n\n00:00.000 --> 00:20.000\nWork\n');
    expect(stale.status).toBe(409);
  });
});

describe('roles and studios', () => {
  it.each([
    ['GET', 'plan'],
    ['GET', 'timeline'],
    ['POST', 'check'],
    ['GET', 'timeline/export?format=csv'],
  ])('a member gets 403 for %s %s', async (method, path) => {
    expect((await member.request(method, `/api/lessons/${lessonId}/${path}`)).status).toBe(403);
  });

  it('a member cannot read or change the exercise list', async () => {
    expect((await member.get('/api/exercises')).status).toBe(403);
    expect((await member.post('/api/exercises', { name: 'Sneaky' })).status).toBe(403);
  });

  it('refuses a duplicate exercise name regardless of case', async () => {
    const res = await coach.post('/api/exercises', { name: 'goblet SQUAT' });
    expect(res.status).toBe(409);
  });
});

describe('the demo draft', () => {
  it('shows its deliberate mistakes through the check', async () => {
    const list = await (await coach.get('/api/lessons')).json();
    const draft = list.lessons.find((l: { slug: string }) => l.slug === 'hill-sprints-prep');
    const check = await (await coach.post(`/api/lessons/${draft.id}/check`)).json();
    const codes = new Set(check.findings.map((f: { code: string }) => f.code));
    for (const code of ['work-too-short', 'overlap', 'missing-station', 'length-vs-advertised']) expect(codes).toContain(code);
    expect(check.ok).toBe(false);
  });
});

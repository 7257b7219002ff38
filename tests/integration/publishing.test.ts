import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { WebVTTParser } from 'webvtt-parser';
import { parse as parseIsoDuration } from 'tinyduration';
import { ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { createSmallClass, smallTimeline } from '../helpers/published-class';

let dir: string;
let coach: ApiClient;
let editor: ApiClient;
let member: ApiClient;
let cls: { lessonId: string; slug: string; recordingId: string };

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-publish-'));
  [coach, editor, member] = await Promise.all([signedIn(DEMO.coach), signedIn(DEMO.editor), signedIn(DEMO.member)]);
  cls = await createSmallClass(coach, dir, `Publish gate ${Date.now()}`);
});
afterAll(() => rm(dir, { recursive: true, force: true }));

const publish = (c: ApiClient, body: object = {}) => c.post(`/api/lessons/${cls.lessonId}/publish`, body);
const timelineVersion = async () => (await (await coach.get(`/api/lessons/${cls.lessonId}/timeline`)).json()).version as number;

describe('the publish gate', () => {
  it('refuses editors: they prepare classes but do not publish', async () => {
    const res = await publish(editor, { acknowledgeWarnings: true });
    expect(res.status).toBe(403);
  });

  it('blocks on errors, listing them', async () => {
    const bad = smallTimeline();
    bad.segments[2]!.startSeconds = 5; // work 2 now overlaps rest 1 and runs 5 s
    await coach.put(`/api/lessons/${cls.lessonId}/timeline`, { version: await timelineVersion(), ...bad });
    const res = await publish(coach, { acknowledgeWarnings: true });
    expect(res.status).toBe(409);
    const { error } = await res.json();
    expect(error.message).toMatch(/timing check found \d+ errors?/);
    expect(error.findings.map((f: { code: string }) => f.code)).toContain('overlap');
    await coach.put(`/api/lessons/${cls.lessonId}/timeline`, { version: await timelineVersion(), ...smallTimeline() });
  });

  it('asks for an acknowledgement of warnings, then publishes version 1 and records it', async () => {
    const first = await publish(coach);
    expect(first.status).toBe(409);
    const body = await first.json();
    expect(body.error.needsAcknowledgement).toBe(true);
    expect(body.error.findings.map((f: { code: string }) => f.code)).toContain('length-vs-advertised');
    const ok = await publish(coach, { acknowledgeWarnings: true });
    expect(ok.status).toBe(201);
    expect((await ok.json()).number).toBe(1);
    const versions = (await (await coach.get(`/api/lessons/${cls.lessonId}/versions`)).json()).versions;
    expect(versions[0]).toMatchObject({ number: 1, warningsAcknowledged: true, publishedBy: 'Tomasz Wren' });
  });

  it('keeps the published version unchanged while the draft is edited, until republished', async () => {
    const before = await (await member.get(`/s/fernhill/classes/${cls.slug}/chapters.vtt`)).text();
    await coach.put(`/api/lessons/${cls.lessonId}/timeline`, { version: await timelineVersion(), ...smallTimeline(), segments: smallTimeline().segments.map((s) => (s.id === 'w1' ? { ...s, exercise: 'Box step' } : s)) });
    expect(await (await member.get(`/s/fernhill/classes/${cls.slug}/chapters.vtt`)).text()).toBe(before);
    expect((await publish(coach, { acknowledgeWarnings: true })).status).toBe(201);
    const after = await (await member.get(`/s/fernhill/classes/${cls.slug}/chapters.vtt`)).text();
    expect(after).not.toBe(before);
    expect(after).toContain('Box step');
  });

  it('only the owner schedules a publish', async () => {
    const at = new Date(Date.now() + 3600_000).toISOString();
    expect((await publish(coach, { publishAt: at, acknowledgeWarnings: true })).status).toBe(403);
    const owner = await signedIn(DEMO.owner);
    expect((await publish(owner, { publishAt: at, acknowledgeWarnings: true })).status).toBe(202);
  });
});

describe('what members get', () => {
  it('a WebVTT chapters file a spec-following parser accepts', async () => {
    const vtt = await (await member.get(`/s/fernhill/classes/${cls.slug}/chapters.vtt`)).text();
    // webvtt-parser 2.2.0 follows the W3C WebVTT parsing algorithm; "chapters" mode rejects markup.
    const parsed = new WebVTTParser().parse(vtt, 'chapters');
    expect(parsed.errors).toEqual([]);
    // The republished version renamed the first move (see above).
    expect(parsed.cues.map((c: { text: string }) => c.text)).toEqual(['Box step · set 1 of 1', 'Step-up · set 2 of 2']);
    // Chapters never overlap (W3C WebVTT §4.5.1); the parser does not check this, so we do.
    expect(parsed.cues[0]!.endTime).toBeLessThanOrEqual(parsed.cues[1]!.startTime);
  });

  it('schema.org VideoObject JSON-LD with an ISO 8601 duration and one Clip per chapter, in order', async () => {
    const html = await (await member.get(`/s/fernhill/classes/${cls.slug}`)).text();
    const json = JSON.parse(html.match(/<script type="application\/ld\+json">(.*?)<\/script>/s)![1]!);
    expect(json['@type']).toBe('VideoObject');
    // ISO 8601 durations read with tinyduration (npm), independent of our formatter.
    const d = parseIsoDuration(json.duration);
    expect((d.hours ?? 0) * 3600 + (d.minutes ?? 0) * 60 + (d.seconds ?? 0)).toBeCloseTo(12, 1);
    expect(json.hasPart.map((c: { '@type': string; startOffset: number; endOffset: number }) => [c['@type'], c.startOffset, c.endOffset])).toEqual([
      ['Clip', 0, 6],
      ['Clip', 6, expect.closeTo(12, 1)],
    ]);
    expect(json.hasPart[1].url).toMatch(new RegExp(`/classes/${cls.slug}#t=6$`));
  });

  it('counts a class finished at 90 % of its work and reports a summary once', async () => {
    const url = `/api/lessons/${cls.lessonId}/progress`;
    const part = await (await member.post(url, { positionSeconds: 5, watched: [[0, 5]] })).json();
    expect(part.finished).toBe(false);
    const done = await (await member.post(url, { positionSeconds: 12, watched: [[5, 12]] })).json();
    expect(done).toMatchObject({ finished: true, justFinished: true });
    expect(done.summary.workWatchedSeconds).toBe(8);
    const again = await (await member.post(url, { positionSeconds: 12, watched: [] })).json();
    expect(again.justFinished).toBe(false);
  });

  it('unpublishing takes the class out of the library; the member gets not found', async () => {
    expect((await coach.post(`/api/lessons/${cls.lessonId}/unpublish`)).status).toBe(200);
    expect((await member.get(`/s/fernhill/classes/${cls.slug}`)).status).toBe(404);
    expect((await new ApiClient().get(`/s/fernhill/classes/${cls.slug}`)).status).toBe(302);
  });
});

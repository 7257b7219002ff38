/**
 * The first progress reports of a member on a class can arrive together (a chapter jump and a
 * pause on first play). Every one must be answered 200 and none lost.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { createAppDeps } from '~/server/app';
import { playEvents, playProgress } from '~/db/schema';
import { type ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { createSmallClass } from '../helpers/published-class';

const deps = createAppDeps(process.env.DATABASE_URL!);
let dir: string;
let member: ApiClient;
let lessonId = '';

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-progress-'));
  const coach = await signedIn(DEMO.coach);
  member = await signedIn(DEMO.member);
  const cls = await createSmallClass(coach, dir, `Progress race ${Date.now()}`);
  const res = await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true });
  if (res.status !== 201) throw new Error(`publish failed: ${res.status}`);
  lessonId = cls.lessonId;
});
afterAll(async () => {
  await deps.pool.end();
  await rm(dir, { recursive: true, force: true });
});

describe('first progress reports racing', () => {
  it('answers every concurrent first report with 200 and keeps all their watched spans and events', async () => {
    // Eight reports at once, each with its own watched second of the 12 s class (invented spans).
    const reports = Array.from({ length: 8 }, (_, i) => ({ positionSeconds: i + 1, watched: [[i, i + 1]], event: i % 2 ? 'chapter' : 'progress' }));
    const answers = await Promise.all(reports.map((r) => member.post(`/api/lessons/${lessonId}/progress`, r)));
    expect(answers.map((a) => a.status)).toEqual(reports.map(() => 200));

    const rows = await deps.db.select().from(playProgress).where(eq(playProgress.lessonId, lessonId));
    expect(rows).toHaveLength(1);
    // The eight one-second spans touch, so merged they are one span 0–8 s.
    expect(rows[0]!.watchedSpans).toEqual([[0, 8]]);
    const events = await deps.db.select().from(playEvents).where(and(eq(playEvents.lessonId, lessonId), eq(playEvents.userId, rows[0]!.userId)));
    expect(events).toHaveLength(8);
  });
});

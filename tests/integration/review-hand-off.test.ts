// "Ready for review" against the real app, worker, PostgreSQL and the local mail fake: an editor
// hands a class off with a note; coaches and the owner are e-mailed and see it on the studio home;
// the wrong roles, another studio's class and bad notes are refused with nothing stored; a coach
// sends it back (the editor is e-mailed) or publishing clears it. Classes and notes are invented.
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { listMessages, waitForMessage } from '../helpers/mail-box';
import { expectWellFormed, onlyAppLink, pathOf, studioName } from '../helpers/mail-flow';
import { createSmallClass } from '../helpers/published-class';
import { createAppDeps } from '~/server/app';
import { lessons, studios, users } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
const suffix = Date.now().toString(36);
let owner: ApiClient;
let coach: ApiClient;
let editor: ApiClient;
let member: ApiClient;
let studio = '';
let dir = '';
let otherStudioId = '';
let otherLessonId = '';
const created: string[] = [];

async function newClass(title: string): Promise<string> {
  const res = await coach.post('/api/lessons', { title, advertisedMinutes: 20 });
  expect(res.status).toBe(201);
  const { id } = (await res.json()) as { id: string };
  created.push(id);
  return id;
}

/** The review columns as stored (read straight from the table). */
async function stored(lessonId: string) {
  const [row] = await deps.db
    .select({ by: lessons.reviewRequestedBy, at: lessons.reviewRequestedAt, note: lessons.reviewNote, version: lessons.version })
    .from(lessons)
    .where(eq(lessons.id, lessonId));
  return row!;
}

const studioHome = async (client: ApiClient) => {
  const res = await client.get('/studio');
  expect(res.status).toBe(200);
  return res.text();
};

beforeAll(async () => {
  [owner, coach, editor, member] = await Promise.all([signedIn(DEMO.owner), signedIn(DEMO.coach), signedIn(DEMO.editor), signedIn(DEMO.member)]);
  studio = await studioName(deps);
  dir = await mkdtemp(join(tmpdir(), 'roundmark-review-'));
  const [other] = await deps.db.insert(studios).values({ slug: `review-other-${suffix}`, name: 'Another Studio' }).returning();
  otherStudioId = other!.id;
  const [anyUser] = await deps.db.select().from(users).limit(1);
  const [lesson] = await deps.db
    .insert(lessons)
    .values({ studioId: otherStudioId, coachId: anyUser!.id, slug: `review-theirs-${suffix}`, title: 'Theirs', advertisedMinutes: 10 })
    .returning();
  otherLessonId = lesson!.id;
});
afterAll(async () => {
  // Leave the demo studio's home as it was: the test's classes go.
  for (const id of created) await owner.del(`/api/lessons/${id}`);
  await deps.db.delete(studios).where(eq(studios.id, otherStudioId));
  await rm(dir, { recursive: true, force: true });
  await deps.pool.end();
});

describe('ready for review', () => {
  it('an editor hands a class off with a note: coaches and the owner get one e-mail each, the editor none; the home page lists it', async () => {
    const title = `Review hand-off ${suffix}`;
    const lessonId = await newClass(title);
    const before = await stored(lessonId);
    const since = new Date();
    const note = 'Marked all rounds.\nThe last rest is short because the recording ends early.';
    const res = await editor.put(`/api/lessons/${lessonId}/review`, { note: `  ${note}  ` });
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body).toMatchObject({ lessonId, title, preparedBy: 'Priya Sandoval', note });
    expect(Date.parse(body.requestedAt)).toBeGreaterThanOrEqual(since.getTime() - 1000);
    const row = await stored(lessonId);
    expect(row.note).toBe(note);
    // A hand-off is not an edit of the class: an open editor's version stays valid.
    expect(row.version).toBe(before.version);

    for (const to of [DEMO.coach, DEMO.owner]) {
      const mail = await waitForMessage(to, { since, timeoutMs: 60_000, match: (e) => !!e.subject?.includes(title) });
      expectWellFormed(mail, to, studio);
      expect(mail.parsed.subject).toBe(`Priya Sandoval marked “${title}” ready for review`);
      expect(mail.parsed.text).toContain('Their note: “Marked all rounds.');
      expect(pathOf(onlyAppLink(mail))).toBe(`/studio/classes/${lessonId}`);
    }
    const toEditor = (await listMessages()).filter((e) => e.to.includes(DEMO.editor) && e.subject?.includes(title));
    expect(toEditor).toEqual([]);

    for (const client of [coach, owner, editor]) {
      const home = await studioHome(client);
      const item = home.slice(home.indexOf(`data-review-item="${lessonId}"`));
      expect(item).toContain(title);
      expect(item).toContain('prepared by Priya Sandoval');
      expect(item).toContain('The last rest is short because the recording ends early.');
    }
    const page = await (await coach.get(`/studio/classes/${lessonId}`)).text();
    expect(page).toContain('Ready for review.');
    expect(page).toContain('Prepared by Priya Sandoval');
  }, 90_000);

  it('refuses members, visitors, another studio’s class and bad notes, storing nothing', async () => {
    const lessonId = await newClass(`Review refusals ${suffix}`);
    expect((await member.put(`/api/lessons/${lessonId}/review`, { note: 'x' })).status).toBe(403);
    expect((await new ApiClient().put(`/api/lessons/${lessonId}/review`, { note: 'x' })).status).toBe(401);
    for (const client of [editor, coach]) {
      const theirs = await client.put(`/api/lessons/${otherLessonId}/review`, { note: 'x' });
      expect(theirs.status).toBe(404);
    }
    const [other] = await deps.db.select({ at: lessons.reviewRequestedAt }).from(lessons).where(eq(lessons.id, otherLessonId));
    expect(other!.at).toBeNull();

    const bad: [unknown, string][] = [
      [{ note: 'x'.repeat(1001) }, 'The note can be at most 1,000 characters.'],
      [{ note: 'before\u0000after' }, 'The note contains a control character (such as NUL) that cannot be stored. Remove it and try again.'],
      [{ note: 7 }, 'The note must be text.'],
    ];
    for (const [input, message] of bad) {
      const res = await editor.put(`/api/lessons/${lessonId}/review`, input);
      expect(res.status).toBe(400);
      expect((await res.json()).error.fields.note).toBe(message);
    }
    expect((await editor.put(`/api/lessons/${lessonId}/review`, 'not json')).status).toBe(400);
    expect(await stored(lessonId)).toMatchObject({ by: null, at: null, note: null });
    expect(await studioHome(coach)).not.toContain(`data-review-item="${lessonId}"`);
  });

  it('an archived class cannot be handed off (409, nothing stored)', async () => {
    const lessonId = await newClass(`Review archived ${suffix}`);
    expect((await coach.post(`/api/lessons/${lessonId}/archive`)).status).toBe(200);
    const res = await editor.put(`/api/lessons/${lessonId}/review`, { note: 'Ready.' });
    expect(res.status).toBe(409);
    expect((await res.json()).error.message).toMatch(/archived class cannot be marked ready/);
    expect((await stored(lessonId)).at).toBeNull();
  });

  it('a coach sends it back with a note: the editor is e-mailed and the wait ends; editors cannot send back, and a note is required', async () => {
    const title = `Review sent back ${suffix}`;
    const lessonId = await newClass(title);
    expect((await editor.put(`/api/lessons/${lessonId}/review`, { note: 'Done, I think.' })).status).toBe(200);

    const asEditor = await editor.post(`/api/lessons/${lessonId}/review/send-back`, { note: 'Self-review' });
    expect(asEditor.status).toBe(403);
    const empty = await coach.post(`/api/lessons/${lessonId}/review/send-back`, { note: '  ' });
    expect(empty.status).toBe(400);
    expect((await empty.json()).error.fields.note).toMatch(/^Say what needs another look/);
    expect((await coach.post(`/api/lessons/${otherLessonId}/review/send-back`, { note: 'x' })).status).toBe(404);
    expect((await stored(lessonId)).note).toBe('Done, I think.');

    const since = new Date();
    const back = await coach.post(`/api/lessons/${lessonId}/review/send-back`, { note: 'Round 3 lacks its cool-down cue.' });
    expect(back.status).toBe(200);
    expect(await back.json()).toEqual({ sentBackTo: 'Priya Sandoval' });
    expect(await stored(lessonId)).toMatchObject({ by: null, at: null, note: null });
    expect(await studioHome(owner)).not.toContain(`data-review-item="${lessonId}"`);

    const mail = await waitForMessage(DEMO.editor, { since, timeoutMs: 60_000, match: (e) => !!e.subject?.includes(title) });
    expectWellFormed(mail, DEMO.editor, studio);
    expect(mail.parsed.subject).toBe(`Tomasz Wren sent “${title}” back for changes`);
    expect(mail.parsed.text).toContain('What needs another look: “Round 3 lacks its cool-down cue.”');

    const again = await coach.post(`/api/lessons/${lessonId}/review/send-back`, { note: 'Twice?' });
    expect(again.status).toBe(409);
    expect((await again.json()).error.message).toMatch(/not waiting for review/);
  }, 90_000);

  it('publishing the class clears the hand-off', async () => {
    const { lessonId } = await createSmallClass(coach, dir, `Review published ${suffix}`);
    created.push(lessonId);
    expect((await editor.put(`/api/lessons/${lessonId}/review`, {})).status).toBe(200);
    expect(await studioHome(coach)).toContain(`data-review-item="${lessonId}"`);
    expect((await coach.post(`/api/lessons/${lessonId}/publish`, { acknowledgeWarnings: true })).status).toBe(201);
    expect((await stored(lessonId)).at).toBeNull();
    expect(await studioHome(coach)).not.toContain(`data-review-item="${lessonId}"`);
  }, 180_000);
});

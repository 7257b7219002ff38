import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { ApiClient, DEMO, signedIn } from '../helpers/api-client';
import { createAppDeps } from '~/server/app';
import { lessons, studios, users } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
type Who = keyof typeof DEMO | 'visitor';
const clients = {} as Record<Who, ApiClient>;
let draftId = '';
let otherStudioLessonId = '';
let coachId = '';

beforeAll(async () => {
  for (const who of Object.keys(DEMO) as (keyof typeof DEMO)[]) clients[who] = await signedIn(DEMO[who]);
  clients.visitor = new ApiClient();
  const [draft] = await deps.db.select().from(lessons).where(eq(lessons.slug, 'hill-sprints-prep'));
  draftId = draft!.id;
  coachId = draft!.coachId;
  // Another studio with one class: its existence must not leak to Fernhill's people.
  const [other] = await deps.db
    .insert(studios)
    .values({ slug: `other-${Date.now()}`, name: 'Another Studio' })
    .returning();
  const [anyUser] = await deps.db.select().from(users).limit(1);
  const [lesson] = await deps.db
    .insert(lessons)
    .values({ studioId: other!.id, coachId: anyUser!.id, slug: 'secret', title: 'Secret', advertisedMinutes: 20 })
    .returning();
  otherStudioLessonId = lesson!.id;
});
afterAll(() => deps.pool.end());

// Expected status per role for each guarded route. 401 signed out, 403 wrong role.
const matrix: [string, string, (c: ApiClient) => Promise<Response>, Record<Who, number>][] = [
  ['GET', '/api/me', (c) => c.get('/api/me'), { visitor: 401, owner: 200, coach: 200, editor: 200, member: 200 }],
  ['GET', '/api/lessons', (c) => c.get('/api/lessons'), { visitor: 401, owner: 200, coach: 200, editor: 200, member: 403 }],
  [
    'POST',
    '/api/lessons',
    (c) => c.post('/api/lessons', { title: 'Role check class', advertisedMinutes: 20, coachId }),
    { visitor: 401, owner: 201, coach: 201, editor: 201, member: 403 },
  ],
  ['GET', '/api/lessons/{draft}', (c) => c.get(`/api/lessons/${draftId}`), { visitor: 401, owner: 200, coach: 200, editor: 200, member: 403 }],
  [
    'DELETE',
    '/api/lessons/{new draft}',
    async (c) => {
      const owner = clients.owner;
      const created = await (await owner.post('/api/lessons', { title: 'To delete', advertisedMinutes: 5 })).json();
      return c.del(`/api/lessons/${created.id}`);
    },
    { visitor: 401, owner: 204, coach: 204, editor: 403, member: 403 },
  ],
];

describe.each(matrix)('%s %s', (_method, _path, call, expected) => {
  it.each(Object.keys(expected) as Who[])('as %s', async (who) => {
    const res = await call(clients[who]);
    expect(res.status).toBe(expected[who]);
    if (res.status >= 400) {
      const body = await res.json();
      expect(body.error.code).toBe({ 401: 'unauthenticated', 403: 'forbidden' }[res.status as 401 | 403]);
      expect(body.error.message.length).toBeGreaterThan(10);
    }
  });
});

describe('pages by role', () => {
  it.each([
    ['visitor', '/studio/classes', 302],
    ['member', '/studio/classes', 403],
    ['editor', '/studio/classes', 200],
    ['coach', '/studio', 200],
    ['owner', '/studio', 200],
    ['visitor', '/library', 302],
    ['member', '/s/fernhill/library', 200],
  ] as [Who, string, number][])('%s opening %s gets %i', async (who, path, status) => {
    expect((await clients[who].get(path)).status).toBe(status);
  });
});

describe("another studio's data", () => {
  it.each(['owner', 'coach', 'editor'] as const)('is not found for %s, so its existence does not leak', async (who) => {
    const res = await clients[who].get(`/api/lessons/${otherStudioLessonId}`);
    expect(res.status).toBe(404);
    const patch = await clients[who].patch(`/api/lessons/${otherStudioLessonId}`, { version: 1, title: 'Taken over' });
    expect(patch.status).toBe(404);
  });
});

describe('stale edits', () => {
  it('answers 409 with the current version and keeps the first save', async () => {
    const coach = clients.coach;
    const created = await (await coach.post('/api/lessons', { title: 'Version check', advertisedMinutes: 15 })).json();
    const first = await coach.patch(`/api/lessons/${created.id}`, { version: created.version, title: 'First save' });
    expect(first.status).toBe(200);
    const stale = await clients.editor.patch(`/api/lessons/${created.id}`, { version: created.version, title: 'Late save' });
    expect(stale.status).toBe(409);
    const body = await stale.json();
    expect(body.error.currentVersion).toBe(created.version + 1);
    expect((await (await coach.get(`/api/lessons/${created.id}`)).json()).title).toBe('First save');
  });
});

describe('forged roles', () => {
  it('ignores a role sent with sign-up: a new account is a member only', async () => {
    const c = new ApiClient();
    const email = `forger-${Date.now()}@test.example`;
    const res = await c.post('/api/auth/sign-up', { name: 'Forger', email, password: 'a long enough password', role: 'owner' });
    expect(res.status).toBe(202);
    expect((await c.signIn(email, 'a long enough password')).status).toBe(200);
    expect((await (await c.get('/api/me')).json()).studio.roles).toEqual(['member']);
    expect((await c.get('/api/lessons')).status).toBe(403);
  });

  it('refuses to make a member the coach of a class', async () => {
    const member = await deps.db.query.users.findFirst({ where: eq(users.email, DEMO.member) });
    const res = await clients.editor.post('/api/lessons', { title: 'Forged coach', advertisedMinutes: 20, coachId: member!.id });
    expect(res.status).toBe(400);
    expect((await res.json()).error.fields.coachId).toBe('Choose a coach of this studio.');
  });
});

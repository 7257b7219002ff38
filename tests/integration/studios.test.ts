// Several studios on one Roundmark: starting a studio through the API, choosing the studio a
// session works in, and a person in two studios seeing each studio's data only under that studio.
// Real PostgreSQL and the real app; the people and studios here are invented for the test.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { ApiClient, signedIn, DEMO } from '../helpers/api-client';
import { createAppDeps } from '~/server/app';
import { billingSettings, memberships, studios, users } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
const run = Date.now().toString(36);
let fernhillId = '';

/** A new person who signed up through the API (so a member of the app's own studio, Fernhill), then signed in. */
async function newPerson(label: string): Promise<{ client: ApiClient; email: string }> {
  const client = new ApiClient(); // each client arrives from its own address (per-address sign-up limits)
  const email = `${label}-${run}@studios.example`;
  const res = await client.post('/api/auth/sign-up', { name: `Person ${label}`, email, password: 'a long enough password' });
  expect(res.status).toBe(202);
  expect((await client.signIn(email, 'a long enough password')).status).toBe(200);
  return { client, email };
}

const studioInput = (slug: string, extra: Record<string, unknown> = {}) => ({
  name: `Studio ${slug}`, slug, timeZone: 'Europe/Lisbon', currency: 'eur', monthlyPriceMinor: 1200, trialDays: 10, accentColour: '#2E5E4E', ...extra,
});
const studioCount = async () => Number((await deps.db.execute<{ n: string }>(sql`select count(*) as n from ${studios}`)).rows[0]!.n);

beforeAll(async () => {
  const [f] = await deps.db.select().from(studios).where(eq(studios.slug, 'fernhill'));
  fernhillId = f!.id;
});
afterAll(async () => {
  await deps.pool.end();
});

describe('start a studio (POST /api/studios)', () => {
  it('makes the person its owner, with its price, trial, zone and colour, and the session works in it', async () => {
    const { client, email } = await newPerson('founder');
    const slug = `larch-${run}`;
    const res = await client.post('/api/studios', studioInput(slug));
    expect(res.status).toBe(201);
    const studio = await res.json();
    expect(studio).toMatchObject({ slug, timeZone: 'Europe/Lisbon', accentColour: '#2E5E4E', roles: ['owner'] });
    const [settings] = await deps.db.select().from(billingSettings).where(eq(billingSettings.studioId, studio.id));
    expect(settings).toMatchObject({ currency: 'eur', monthlyPriceMinor: 1200, trialDays: 10 });
    const me = await (await client.get('/api/me')).json();
    expect(me.studio).toMatchObject({ studioSlug: slug, roles: ['owner'] });
    // The same e-mail is still a member at Fernhill: one person, two studios, a role in each.
    const [user] = await deps.db.select().from(users).where(eq(users.email, email));
    const roles = await deps.db.select({ studioId: memberships.studioId, role: memberships.role }).from(memberships).where(eq(memberships.userId, user!.id));
    expect(roles).toEqual(expect.arrayContaining([{ studioId: fernhillId, role: 'member' }, { studioId: studio.id, role: 'owner' }]));
    expect(roles).toHaveLength(2);
  });

  it.each([
    ['a reserved address', { slug: 'library' }, 'slug'],
    ['an address with a slash', { slug: 'a/b' }, 'slug'],
    ['a colour text cannot sit on (WCAG 2.2 AA 4.5:1)', { accentColour: '#6F7A89' }, 'accentColour'],
    ['an unknown time zone', { timeZone: 'Europe/Atlantis' }, 'timeZone'],
    ['a price below 1.00', { monthlyPriceMinor: 50 }, 'monthlyPriceMinor'],
  ])('refuses %s with 400 at that field and writes nothing', async (what, change, field) => {
    const { client } = await newPerson(`refused-${what.length}-${field.toLowerCase()}`);
    const before = await studioCount();
    const res = await client.post('/api/studios', studioInput(`ok-${run}-${field.toLowerCase()}`, change));
    expect(res.status).toBe(400);
    expect(Object.keys((await res.json()).error.fields ?? {})).toEqual([field]);
    expect(await studioCount()).toBe(before);
  });

  it('an address in use (or racing for the same one) answers 409 for all but one founder', async () => {
    const people = await Promise.all([newPerson('race-a'), newPerson('race-b'), newPerson('race-c')]);
    const slug = `race-${run}`;
    const answers = await Promise.all(people.map((p) => p.client.post('/api/studios', studioInput(slug))));
    expect(answers.map((r) => r.status).sort()).toEqual([201, 409, 409]);
    const refused = await answers.find((r) => r.status === 409)!.json();
    expect(refused.error.fields).toHaveProperty('slug');
    expect((await deps.db.select().from(studios).where(eq(studios.slug, slug))).length).toBe(1);
    // The losers own no studio afterwards (no half-written studio, no owner row).
    const owners = await deps.db.execute(sql`select 1 from ${memberships} m join ${studios} s on s.id = m.studio_id where s.slug = ${slug} and m.role = 'owner'`);
    expect(owners.rows).toHaveLength(1);
  });

  it('a visitor cannot start a studio through the API (401)', async () => {
    expect((await new ApiClient().post('/api/studios', studioInput(`visitor-${run}`))).status).toBe(401);
  });
});

describe('the studio a session works in', () => {
  it('a person in two studios chooses one; each studio’s classes show only under it', async () => {
    const { client, email } = await newPerson('two-studios');
    const own = await (await client.post('/api/studios', studioInput(`own-${run}`))).json();
    const cls = await client.post('/api/lessons', { title: 'Own studio class', advertisedMinutes: 10, impact: 'low' });
    expect(cls.status).toBe(201);
    const classId = (await cls.json()).id as string;
    const list = await (await client.get('/api/lessons')).json();
    expect(JSON.stringify(list)).toContain(classId);

    // Switching to Fernhill, where this person is a member: the own studio's class is not there.
    const switched = await client.put('/api/me/studio', { studioId: fernhillId });
    expect(switched.status).toBe(200);
    expect((await switched.json()).roles).toEqual(['member']);
    expect((await (await client.get('/api/me')).json()).studio.studioSlug).toBe('fernhill');
    // A member at Fernhill: the staff API refuses before it looks (403), so the own studio's class never shows here.
    expect((await client.get(`/api/lessons/${classId}`)).status).toBe(403);
    expect((await client.get('/api/lessons')).status).toBe(403);

    // Back in the own studio, the class is there again.
    expect((await client.put('/api/me/studio', { studioId: own.id })).status).toBe(200);
    expect((await client.get(`/api/lessons/${classId}`)).status).toBe(200);

    // A new session has not chosen yet: no studio, and studio pages ask which one.
    const second = new ApiClient();
    expect((await second.signIn(email, 'a long enough password')).status).toBe(200);
    expect((await (await second.get('/api/me')).json()).studio).toBeNull();
    const page = await second.get('/studio/classes');
    expect(page.status).toBe(302);
    expect(page.headers.get('location')).toBe('/studios?next=%2Fstudio%2Fclasses');
    const studiosList = await (await second.get('/api/studios')).json();
    expect(studiosList.currentStudioId).toBeNull();
    expect(studiosList.studios.map((s: { slug: string }) => s.slug).sort()).toEqual(['fernhill', `own-${run}`].sort());
  });

  it('an owner of two studios sees each one’s classes only under it: the other’s class id is 404', async () => {
    const { client } = await newPerson('two-owner');
    const a = await (await client.post('/api/studios', studioInput(`first-${run}`))).json();
    const classA = (await (await client.post('/api/lessons', { title: 'Class of the first', advertisedMinutes: 10, impact: 'low' })).json()).id as string;
    const b = await (await client.post('/api/studios', studioInput(`second-${run}`))).json();
    expect((await (await client.get('/api/me')).json()).studio.studioId).toBe(b.id);
    const classB = (await (await client.post('/api/lessons', { title: 'Class of the second', advertisedMinutes: 10, impact: 'low' })).json()).id as string;
    for (const path of [`/api/lessons/${classA}`, `/api/lessons/${classA}/plan`, `/api/lessons/${classA}/timeline`]) expect((await client.get(path)).status).toBe(404);
    expect(JSON.stringify(await (await client.get('/api/lessons')).json())).not.toContain(classA);
    expect((await client.put('/api/me/studio', { studioId: a.id })).status).toBe(200);
    expect((await client.get(`/api/lessons/${classB}`)).status).toBe(404);
    expect((await client.get(`/api/lessons/${classA}`)).status).toBe(200);
  });

  it('another studio’s id, an unknown id and a malformed one: 404, 404, 400; the choice is unchanged', async () => {
    const { client } = await newPerson('outsider');
    const other = await (await (await signedIn(DEMO.owner)).get('/api/me')).json();
    const { client: founder } = await newPerson('third-studio');
    const third = await (await founder.post('/api/studios', studioInput(`third-${run}`))).json();
    expect((await client.put('/api/me/studio', { studioId: third.id })).status).toBe(404);
    expect((await client.put('/api/me/studio', { studioId: '00000000-0000-4000-8000-000000000000' })).status).toBe(404);
    expect((await client.put('/api/me/studio', { studioId: 'not-a-uuid' })).status).toBe(400);
    expect((await (await client.get('/api/me')).json()).studio.studioId).toBe(other.studio.studioId);
    // The founder of the third studio cannot reach Fernhill's classes by switching either.
    expect((await founder.put('/api/me/studio', { studioId: fernhillId })).status).toBe(200);
    expect((await founder.put('/api/me/studio', { studioId: third.id })).status).toBe(200);
  });
});

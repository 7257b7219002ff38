// Owners change their studio's name, address, colour and logo after starting it; links to an
// address the studio left keep working (permanent redirect). Real PostgreSQL, the real object
// store and the real app; the people, studios and pictures here are invented for the test.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import sharp from 'sharp';
import { ApiClient } from '../helpers/api-client';
import { createAppDeps } from '~/server/app';
import { memberships, studios, studioSlugRedirects } from '~/db/schema';

const deps = createAppDeps(process.env.DATABASE_URL!);
const run = Date.now().toString(36);

const studioInput = (slug: string) => ({
  name: `Studio ${slug}`, slug, timeZone: 'Europe/Lisbon', currency: 'eur', monthlyPriceMinor: 1200, trialDays: 10, accentColour: '#2E5E4E',
});

/** A new signed-in person, optionally the owner of a new studio. */
async function person(label: string): Promise<{ client: ApiClient; userId: string }> {
  const client = new ApiClient();
  const userId = await client.signUpAndIn({ name: `Person ${label}`, email: `${label}-${run}@identity.example`, password: 'a long enough password' });
  return { client, userId };
}
async function owner(label: string, slug: string) {
  const p = await person(label);
  const res = await p.client.post('/api/studios', studioInput(slug));
  expect(res.status).toBe(201);
  return { ...p, studioId: (await res.json()).id as string };
}

// An invented picture: a 1000 × 500 PNG with an alpha channel.
const widePng = () => sharp({ create: { width: 1000, height: 500, channels: 4, background: { r: 46, g: 94, b: 78, alpha: 0.5 } } }).png().toBuffer();

afterAll(async () => {
  await deps.pool.end();
});

describe('owners edit the name, address and colour (PUT /api/studios/{id})', () => {
  let founder: Awaited<ReturnType<typeof owner>>;
  const first = `tern-${run}`;
  const second = `tern-moved-${run}`;
  beforeAll(async () => {
    founder = await owner('mover', first);
  });

  it('saves them; the old address redirects for good (308), keeping the rest of the link', async () => {
    const res = await founder.client.put(`/api/studios/${founder.studioId}`, { name: 'Tern Movement', slug: second, accentColour: '#1d4e89' });
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ id: founder.studioId, name: 'Tern Movement', slug: second, accentColour: '#1D4E89', logoUrl: null });
    const page = await new ApiClient().get(`/s/${second}`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('Tern Movement');
    const old = await new ApiClient().get(`/s/${first}/library?q=core`);
    expect(old.status).toBe(308);
    expect(old.headers.get('location')).toBe(`/s/${second}/library?q=core`);
    expect((await new ApiClient().get(`/s/${first}`)).headers.get('location')).toBe(`/s/${second}`);
  });

  it('keeps the old address taken by nobody else, while the studio itself may move back to it', async () => {
    const other = await person('squatter');
    const taken = await other.client.post('/api/studios', studioInput(first));
    expect(taken.status).toBe(409);
    expect((await taken.json()).error.fields).toHaveProperty('slug');
    const back = await founder.client.put(`/api/studios/${founder.studioId}`, { name: 'Tern Movement', slug: first, accentColour: '#1D4E89' });
    expect(back.status).toBe(200);
    // Now the address it left in between redirects, and the one it came back to no longer does.
    expect((await new ApiClient().get(`/s/${second}/join`)).headers.get('location')).toBe(`/s/${first}/join`);
    expect((await new ApiClient().get(`/s/${first}`)).status).toBe(200);
    const rows = await deps.db.select().from(studioSlugRedirects).where(eq(studioSlugRedirects.studioId, founder.studioId));
    expect(rows.map((r) => r.slug)).toEqual([second]);
  });

  it.each([
    ['a reserved address', { slug: 'join' }, 'slug'],
    ['an address in the wrong shape', { slug: 'Two Words' }, 'slug'],
    ['a colour text cannot sit on (WCAG 2.2 AA 4.5:1)', { accentColour: '#6F7A89' }, 'accentColour'],
    ['an empty name', { name: ' ' }, 'name'],
  ])('refuses %s with 400 at that field and changes nothing', async (_what, change, field) => {
    const before = await deps.db.query.studios.findFirst({ where: eq(studios.id, founder.studioId) });
    const res = await founder.client.put(`/api/studios/${founder.studioId}`, { name: 'Renamed', slug: `renamed-${run}`, accentColour: '#1D4E89', ...change });
    expect(res.status).toBe(400);
    expect(Object.keys((await res.json()).error.fields ?? {})).toEqual([field]);
    expect(await deps.db.query.studios.findFirst({ where: eq(studios.id, founder.studioId) })).toEqual(before);
  });

  it('refuses the address of another studio (409), a member of the studio (403) and anyone outside it (404)', async () => {
    const rival = await owner('rival', `rival-${run}`);
    expect((await founder.client.put(`/api/studios/${founder.studioId}`, { name: 'Tern Movement', slug: `rival-${run}`, accentColour: '#1D4E89' })).status).toBe(409);
    expect((await rival.client.put(`/api/studios/${founder.studioId}`, { name: 'Taken over', slug: `over-${run}`, accentColour: '#1D4E89' })).status).toBe(404);
    const member = await person('member');
    await deps.db.insert(memberships).values({ userId: member.userId, studioId: founder.studioId, role: 'member' });
    expect((await member.client.put(`/api/studios/${founder.studioId}`, { name: 'Mine now', slug: `mine-${run}`, accentColour: '#1D4E89' })).status).toBe(403);
    const [row] = await deps.db.select().from(studios).where(eq(studios.id, founder.studioId));
    expect(row!.name).toBe('Tern Movement');
  });
});

describe('the studio logo (PUT/DELETE /api/studios/{id}/logo, GET /logos/…)', () => {
  let founder: Awaited<ReturnType<typeof owner>>;
  const slug = `logo-${run}`;
  beforeAll(async () => {
    founder = await owner('logo', slug);
  });

  it('is checked by its bytes, scaled to fit 256 × 256 with its proportions, stored as PNG and shown on the studio page and header', async () => {
    const res = await founder.client.put(`/api/studios/${founder.studioId}/logo`, new Uint8Array(await widePng()));
    expect(res.status).toBe(200);
    const { logoUrl } = await res.json();
    expect(logoUrl).toMatch(new RegExp(`^/logos/${founder.studioId}/[0-9a-f-]{36}\\.png$`));
    const file = await new ApiClient().get(logoUrl);
    expect(file.status).toBe(200);
    expect(file.headers.get('content-type')).toBe('image/png');
    const meta = await sharp(Buffer.from(await file.arrayBuffer())).metadata();
    expect([meta.format, meta.width, meta.height, meta.hasAlpha]).toEqual(['png', 256, 128, true]);
    expect(await (await new ApiClient().get(`/s/${slug}`)).text()).toContain(logoUrl);
    expect(await (await founder.client.get('/studio/settings')).text()).toContain(`src="${logoUrl}"`);
  });

  it('refuses a file that is not a picture (415) and an empty one (400), keeping the logo it had', async () => {
    const before = await deps.db.query.studios.findFirst({ where: eq(studios.id, founder.studioId) });
    const svg = new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>');
    expect((await founder.client.put(`/api/studios/${founder.studioId}/logo`, svg)).status).toBe(415);
    const truncated = (await widePng()).subarray(0, 60);
    expect((await founder.client.put(`/api/studios/${founder.studioId}/logo`, new Uint8Array(truncated))).status).toBe(415);
    expect((await founder.client.put(`/api/studios/${founder.studioId}/logo`, new Uint8Array(0))).status).toBe(400);
    expect((await deps.db.query.studios.findFirst({ where: eq(studios.id, founder.studioId) }))!.logoFile).toBe(before!.logoFile);
  });

  it('is the owner’s alone; removing it takes it off the pages and its old link answers 404', async () => {
    const stranger = await person('logo-stranger');
    expect((await stranger.client.del(`/api/studios/${founder.studioId}/logo`)).status).toBe(404);
    const [{ logoFile }] = await deps.db.select({ logoFile: studios.logoFile }).from(studios).where(eq(studios.id, founder.studioId)) as [{ logoFile: string }];
    const res = await founder.client.del(`/api/studios/${founder.studioId}/logo`);
    expect(res.status).toBe(200);
    expect((await res.json()).logoUrl).toBeNull();
    expect((await new ApiClient().get(`/logos/${founder.studioId}/${logoFile}`)).status).toBe(404);
  });
});


// The shared library pages (src/server/library-cache.ts): computed once, dropped when any
// process announces a change through PostgreSQL LISTEN/NOTIFY. Real PostgreSQL, real app server.
import { randomUUID } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { createAppDeps } from '~/server/app';
import { LibraryCache, notifyLibraryChanged } from '~/server/library-cache';
import { DEMO, signedIn } from '../helpers/api-client';

const deps = createAppDeps(process.env.DATABASE_URL!);
const caches: LibraryCache[] = [];
afterAll(async () => {
  await Promise.all(caches.map((c) => c.stop()));
  await deps.pool.end();
});

/** A cache that has finished connecting its listener (until then it does not cache). */
async function listeningCache(ttlMs?: number) {
  const cache = new LibraryCache({ connectionString: process.env.DATABASE_URL! }, ttlMs);
  caches.push(cache);
  for (let i = 0; i < 100; i++) {
    let loaded = false;
    await cache.get('probe', 'probe', async () => ((loaded = true), 1));
    if (!loaded) return cache;
    await new Promise((r) => setTimeout(r, 20));
  }
  throw new Error('the cache never started listening');
}

function counter() {
  let calls = 0;
  return { load: async () => ++calls, calls: () => calls };
}

describe('LibraryCache', () => {
  it('computes a page once for everyone asking the same', async () => {
    const cache = await listeningCache();
    const c = counter();
    const values = await Promise.all([cache.get('s1', 'k', c.load), cache.get('s1', 'k', c.load), cache.get('s1', 'k', c.load)]);
    expect(values).toEqual([1, 1, 1]);
    expect(c.calls()).toBe(1);
    expect(await cache.get('s1', 'other', c.load)).toBe(2);
  });

  it("drops a studio's pages when another process announces a change, and only that studio's", async () => {
    const cache = await listeningCache();
    const a = counter();
    const b = counter();
    await cache.get('studio-a', 'page', a.load);
    await cache.get('studio-b', 'page', b.load);
    await notifyLibraryChanged(deps.pool, 'studio-a'); // another connection, as the worker would
    await expect.poll(async () => cache.get('studio-a', 'page', a.load), { timeout: 5_000, interval: 20 }).toBe(2);
    expect(await cache.get('studio-b', 'page', b.load)).toBe(1);
  });

  it('forgets pages after the time to live, and never keeps a failed query', async () => {
    const cache = await listeningCache(150);
    const c = counter();
    await cache.get('s', 'k', c.load);
    await new Promise((r) => setTimeout(r, 250));
    expect(await cache.get('s', 'k', c.load)).toBe(2);

    await expect(cache.get('s', 'broken', async () => Promise.reject(new Error('database down')))).rejects.toThrow('database down');
    expect(await cache.get('s', 'broken', async () => 'recovered')).toBe('recovered');
  });

  it('caches nothing once its listener is gone (no page may outlive a change nobody heard of)', async () => {
    const cache = await listeningCache();
    const c = counter();
    await cache.get('s', 'k', c.load);
    // End the listener's connection from the server side, as a restart of PostgreSQL would.
    await deps.db.execute(sql`select pg_terminate_backend(pid) from pg_stat_activity where query = 'listen library_changed' and pid <> pg_backend_pid()`);
    await expect.poll(async () => cache.get('s', 'k', c.load), { timeout: 5_000, interval: 20 }).toBeGreaterThan(1);
  });
});

describe('the library page across processes', () => {
  it('shows a class published by another process at once, through the notification', async () => {
    const member = await signedIn(DEMO.member);
    const word = `zq${randomUUID().slice(0, 8)}`;
    const url = `/s/fernhill/library?q=${word}`;
    const count = async () => /data-testid="result-count"[^>]*>\s*([^<]*)/.exec(await (await member.get(url)).text())?.[1]?.trim() ?? '';
    await member.get('/s/fernhill/library');
    await new Promise((r) => setTimeout(r, 500)); // the server's listener connects on first use

    expect(await count()).toMatch(/^No classes match/);
    // Published behind the server's back (plain SQL, no notification): its shared page stays as it was.
    const [row] = (
      await deps.db.execute<{ studio_id: string; lesson_id: string }>(sql`
        with l as (
          insert into lessons (studio_id, coach_id, slug, title, advertised_minutes, state, search_document, published_at)
          select s.id, (select id from users where email = ${DEMO.coach}), ${word}, ${'Cache check ' + word}, 20, 'published', ${word}, now()
          from studios s where s.slug = 'fernhill' returning id, studio_id
        ), r as (
          insert into recordings (studio_id, lesson_id, state, source_key, file_name, content_type, size_bytes)
          select studio_id, id, 'ready', 'tests/' || id, 'x.mp4', 'video/mp4', 1 from l returning id, lesson_id, studio_id
        ), v as (
          insert into lesson_versions (lesson_id, number, recording_id, snapshot, chapters_vtt, duration_seconds)
          select lesson_id, 1, id, '{}'::jsonb, 'WEBVTT', 1200 from r returning id
        )
        select r.studio_id, r.lesson_id from r, v`)
    ).rows;
    // A separate statement: rows inserted inside a WITH are not visible to the same statement's UPDATE.
    await deps.db.execute(sql`update lessons set published_version_id = v.id from lesson_versions v where v.lesson_id = lessons.id and lessons.id = ${row!.lesson_id}::uuid`);
    try {
      expect(await count()).toMatch(/^No classes match/);
      await notifyLibraryChanged(deps.pool, row!.studio_id);
      await expect.poll(count, { timeout: 5_000, interval: 50 }).toMatch(/^1 class\b/);
    } finally {
      await deps.db.execute(sql`delete from lessons where id = ${row!.lesson_id}::uuid`);
      await notifyLibraryChanged(deps.pool, row!.studio_id);
    }
  });
});

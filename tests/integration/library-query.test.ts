import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { createAppDeps } from '~/server/app';
import { searchLibrary } from '~/server/services/library';
import { libraryQuery, PAGE_SIZE } from '~/lib/api/library-schemas';
import { generateStudioWithClasses } from '../helpers/many-classes';

const deps = createAppDeps(process.env.DATABASE_URL!);
const N = 10_000;
let studioId = '';
let coachA = '';
const query = (q: object) => libraryQuery.parse(q);

beforeAll(async () => {
  ({ studioId, coachA } = await generateStudioWithClasses(deps, N));
}, 120_000);
afterAll(() => deps.pool.end());

// Expected counts are computed by enumerating the generator's patterns here, not by the query code.
const classes = Array.from({ length: N }, (_, i) => {
  const g = i + 1;
  return {
    g,
    minutes: (5 + (g % 12) * 5) - 0.5,
    noEquipment: g % 3 === 0,
    impact: ['low', 'moderate', 'high'][g % 3],
    focus: ['core', 'full body', 'mobility', 'cardio'][g % 4],
    difficulty: ['beginner', 'intermediate', 'advanced'][g % 3],
    coachA: g % 2 === 0,
    kettlebell: g % 10 === 0,
  };
});

describe('library queries on 10,000 classes', () => {
  it('combines filters: low impact AND under 15 minutes AND (no equipment)', async () => {
    const expected = classes.filter((c) => c.impact === 'low' && c.minutes < 15 && c.noEquipment).length;
    const res = await searchLibrary(deps, studioId, query({ impact: 'low', length: 'under-15', equipment: 'none' }));
    expect(res.total).toBe(expected);
    expect(expected).toBeGreaterThan(0);
  });

  it('ORs within a filter and ANDs across filters', async () => {
    const expected = classes.filter((c) => (c.focus === 'core' || c.focus === 'mobility') && c.coachA && c.difficulty !== 'advanced').length;
    const res = await searchLibrary(deps, studioId, query({ focus: ['core', 'mobility'], coach: coachA, difficulty: ['beginner', 'intermediate'] }));
    expect(res.total).toBe(expected);
  });

  it('searches titles, descriptions and exercise names with PostgreSQL full-text search (stemming: "swings" finds "swing")', async () => {
    const res = await searchLibrary(deps, studioId, query({ q: 'kettlebell swings' }));
    expect(res.total).toBe(classes.filter((c) => c.kettlebell).length);
    expect(res.lessons.every((l) => l.title.includes('Kettlebell'))).toBe(true);
  });

  it('pages are stable: walking every page of a sort visits each class exactly once', async () => {
    const seen = new Set<string>();
    const q = { impact: 'high', sort: 'shortest' };
    const total = classes.filter((c) => c.impact === 'high').length;
    for (let page = 1; page <= Math.ceil(total / PAGE_SIZE); page++) {
      const res = await searchLibrary(deps, studioId, query({ ...q, page }));
      for (const l of res.lessons) seen.add(l.id);
    }
    expect(seen.size).toBe(total);
  });

  it('newest first follows the dates of the published versions, page after page', async () => {
    // Expected order read from the versions themselves, not from the listing's own columns.
    const expected = await deps.db.execute<{ id: string }>(sql`
      select l.id from lessons l join lesson_versions v on v.id = l.published_version_id
      where l.studio_id = ${studioId}::uuid and l.impact = 'moderate'
      order by v.published_at desc, l.id limit ${PAGE_SIZE * 2}`);
    const first = await searchLibrary(deps, studioId, query({ impact: 'moderate', sort: 'newest' }));
    const second = await searchLibrary(deps, studioId, query({ impact: 'moderate', sort: 'newest', page: 2 }));
    expect([...first.lessons, ...second.lessons].map((l) => l.id)).toEqual(expected.rows.map((r) => r.id));
  });

  it('sorts by length', async () => {
    const res = await searchLibrary(deps, studioId, query({ sort: 'longest' }));
    const lengths = res.lessons.map((l) => l.publishedSeconds!);
    expect(lengths).toEqual([...lengths].sort((a, b) => b - a));
  });
});

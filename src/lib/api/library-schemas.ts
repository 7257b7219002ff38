import { z } from 'zod';
import { difficultyLevels, impactLevels } from './lesson-schemas';

/** Length ranges members filter by, in minutes [from, to). */
export const LENGTH_RANGES = {
  'under-15': [0, 15],
  '15-30': [15, 30],
  '30-45': [30, 45],
  'over-45': [45, 24 * 60],
} as const;
export const LIBRARY_SORTS = ['newest', 'shortest', 'longest', 'title'] as const;
export const PAGE_SIZE = 24;

const many = <T extends z.ZodType>(item: T) =>
  z.preprocess((v) => (v === undefined || v === '' ? [] : Array.isArray(v) ? v : [v]), z.array(item).max(10));

/** Library filters as they live in the URL query (`?impact=low&length=under-15&q=squat`). */
export const libraryQuery = z
  .object({
    q: z.string().trim().max(100).optional().describe('Words to find in titles, descriptions and exercise names'),
    length: many(z.enum(Object.keys(LENGTH_RANGES) as [keyof typeof LENGTH_RANGES])),
    impact: many(z.enum(impactLevels)),
    difficulty: many(z.enum(difficultyLevels)),
    equipment: many(z.string().trim().min(1).max(60)).describe('"none" for classes without equipment'),
    focus: many(z.string().trim().min(1).max(60)),
    coach: many(z.string().min(1).max(40)),
    sort: z.enum(LIBRARY_SORTS).catch('newest'),
    page: z.coerce.number().int().min(1).max(10_000).catch(1),
  })
  .meta({ id: 'LibraryQuery' });
export type LibraryQuery = z.infer<typeof libraryQuery>;

/** Reads the query from URL search params (repeated keys become lists). */
export function parseLibraryQuery(params: URLSearchParams): LibraryQuery {
  const raw: Record<string, string | string[]> = {};
  for (const key of new Set(params.keys())) {
    const all = params.getAll(key).filter((v) => v !== '');
    raw[key] = all.length === 1 ? all[0]! : all;
  }
  const parsed = libraryQuery.safeParse(raw);
  return parsed.success ? parsed.data : libraryQuery.parse({});
}

/** The URL for a query (used by filter links and pagination). */
export function libraryHref(query: LibraryQuery, change: Partial<LibraryQuery> = {}): string {
  const q = { ...query, ...change };
  const params = new URLSearchParams();
  if (q.q) params.set('q', q.q);
  for (const key of ['length', 'impact', 'difficulty', 'equipment', 'focus', 'coach'] as const) for (const v of q[key]) params.append(key, v);
  if (q.sort !== 'newest') params.set('sort', q.sort);
  if (q.page > 1) params.set('page', String(q.page));
  const s = params.toString();
  return s ? `/library?${s}` : '/library';
}

import { z } from 'zod';
import { noControlCharacters } from './text-rules';
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
    q: z.string().trim().max(100).regex(...noControlCharacters('The search')).optional().describe('Words to find in titles, descriptions and exercise names'),
    length: many(z.enum(Object.keys(LENGTH_RANGES) as [keyof typeof LENGTH_RANGES])),
    impact: many(z.enum(impactLevels)),
    difficulty: many(z.enum(difficultyLevels)),
    equipment: many(z.string().trim().min(1).max(60).regex(...noControlCharacters('The equipment'))).describe('"none" for classes without equipment'),
    focus: many(z.string().trim().min(1).max(60).regex(...noControlCharacters('The focus'))),
    coach: many(z.string().min(1).max(40).regex(...noControlCharacters('The coach'))),
    sort: z.enum(LIBRARY_SORTS).catch('newest'),
    page: z.coerce.number().int().min(1).max(10_000).catch(1),
  })
  .meta({ id: 'LibraryQuery' });
export type LibraryQuery = z.infer<typeof libraryQuery>;

const LIST_FILTERS = ['length', 'impact', 'difficulty', 'equipment', 'focus', 'coach'] as const;
export type LibraryFilterName = (typeof LIST_FILTERS)[number];

/** A library query read from a URL, with a message for each filter that held a value we do not know. */
export interface ReadLibraryQuery {
  query: LibraryQuery;
  /** Keyed by the form field (`q`, `length`, …); shown next to that field. */
  problems: Partial<Record<'q' | LibraryFilterName, string>>;
}

/**
 * Reads the query from URL search params (repeated keys become lists).
 * An empty value means "not set" (the filter form always sends `q=`). A value we cannot use
 * is dropped on its own, with a message for its filter; the other filters still apply, so a
 * typo in one never silently resets the rest.
 */
export function readLibraryQuery(params: URLSearchParams): ReadLibraryQuery {
  const shape = libraryQuery.shape;
  const problems: ReadLibraryQuery['problems'] = {};
  const values = (key: string) => params.getAll(key).map((v) => v.trim()).filter((v) => v !== '');

  const q = values('q')[0];
  let text: string | undefined;
  if (q !== undefined) {
    const parsed = shape.q.safeParse(q);
    if (parsed.success) text = parsed.data;
    else problems.q = 'Search words are limited to 100 characters. Shorten them and search again.';
  }
  const lists = {} as Record<LibraryFilterName, string[]>;
  for (const key of LIST_FILTERS) {
    const all = [...new Set(values(key))];
    const ok = all.filter((v) => shape[key].safeParse([v]).success).slice(0, 10);
    const bad = all.filter((v) => !shape[key].safeParse([v]).success);
    lists[key] = ok;
    if (bad.length) problems[key] = `We do not know ${bad.map((v) => `“${v.slice(0, 40)}”`).join(', ')} here, so it is left out. Pick from the list.`;
    else if (all.length > 10) problems[key] = 'Pick at most 10 here; only the first 10 are used.';
  }
  const query = libraryQuery.parse({
    ...lists,
    ...(text !== undefined ? { q: text } : {}),
    sort: values('sort')[0],
    page: values('page')[0],
  });
  return { query, problems };
}

/** Reads the query from URL search params, dropping values it cannot use (see `readLibraryQuery`). */
export function parseLibraryQuery(params: URLSearchParams): LibraryQuery {
  return readLibraryQuery(params).query;
}

/** The URL for a query (used by filter links and pagination). */
export function libraryHref(query: LibraryQuery, change: Partial<LibraryQuery> = {}, base = '/library'): string {
  const q = { ...query, ...change };
  const params = new URLSearchParams();
  if (q.q) params.set('q', q.q);
  for (const key of LIST_FILTERS) for (const v of q[key]) params.append(key, v);
  if (q.sort !== 'newest') params.set('sort', q.sort);
  if (q.page > 1) params.set('page', String(q.page));
  const s = params.toString();
  return s ? `${base}?${s}` : base;
}

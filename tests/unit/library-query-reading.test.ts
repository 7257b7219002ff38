import { describe, expect, it } from 'vitest';
import { readLibraryQuery } from '~/lib/api/library-schemas';

const read = (qs: string) => readLibraryQuery(new URLSearchParams(qs));

describe('reading library filters from the URL the filter form produces', () => {
  it('treats an empty search box as "not set" and keeps the ticked filters', () => {
    // This is exactly what the form sends with an empty search box.
    const { query, problems } = read('q=&impact=low&length=under-15&sort=newest');
    expect(query.q).toBeUndefined();
    expect(query.impact).toEqual(['low']);
    expect(query.length).toEqual(['under-15']);
    expect(problems).toEqual({});
  });

  it('drops only the unknown value and says so next to its filter; the others still apply', () => {
    const { query, problems } = read('q=squat&impact=low&impact=gentle&length=under-15');
    expect(query.impact).toEqual(['low']);
    expect(query.length).toEqual(['under-15']);
    expect(query.q).toBe('squat');
    expect(problems.impact).toContain('“gentle”');
    expect(problems.length).toBeUndefined();
  });

  it('keeps filters when the search words are too long, with a message for the search box', () => {
    const { query, problems } = read(`q=${'a'.repeat(101)}&difficulty=beginner`);
    expect(query.q).toBeUndefined();
    expect(query.difficulty).toEqual(['beginner']);
    expect(problems.q).toMatch(/100 characters/);
  });

  it('ignores empty list values and duplicates', () => {
    const { query, problems } = read('focus=&focus=core&focus=core&coach=');
    expect(query.focus).toEqual(['core']);
    expect(query.coach).toEqual([]);
    expect(problems).toEqual({});
  });
});

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { reviewRecipients, reviewRequestRefusal, sendBackRefusal } from '~/lib/publishing/review-hand-off';
import { readyForReviewInput, sendBackInput } from '~/lib/api/review-schemas';
import { roles, type Role } from '~/lib/api/auth-schemas';

// Expectations written from the product brief (/work/shared/design.md): editors hand a prepared
// class to "a coach or the owner", the people who publish. People and ids are invented.
describe('who is told that a class waits for review', () => {
  it('tells the coaches and the owner, not editors or members, and never the person who handed it off', () => {
    const staff: { userId: string; role: Role }[] = [
      { userId: 'owner-1', role: 'owner' },
      { userId: 'owner-1', role: 'coach' },
      { userId: 'coach-1', role: 'coach' },
      { userId: 'coach-2', role: 'coach' },
      { userId: 'editor-1', role: 'editor' },
      { userId: 'member-1', role: 'member' },
    ];
    expect(reviewRecipients(staff, 'editor-1')).toEqual(['owner-1', 'coach-1', 'coach-2']);
    expect(reviewRecipients(staff, 'coach-2')).toEqual(['owner-1', 'coach-1']);
    expect(reviewRecipients(staff, null)).toEqual(['owner-1', 'coach-1', 'coach-2']);
  });

  it('for any team: each recipient once, each a publisher, never the one who asked', () => {
    const person = fc.record({ userId: fc.constantFrom('a', 'b', 'c', 'd', 'e'), role: fc.constantFrom(...roles) });
    fc.assert(
      fc.property(fc.array(person, { maxLength: 12 }), fc.option(fc.constantFrom('a', 'b', 'c'), { nil: null }), (staff, asker) => {
        const got = reviewRecipients(staff, asker);
        expect(new Set(got).size).toBe(got.length);
        for (const id of got) {
          expect(id).not.toBe(asker);
          expect(staff.some((p) => p.userId === id && (p.role === 'owner' || p.role === 'coach'))).toBe(true);
        }
        const expected = new Set(staff.filter((p) => (p.role === 'owner' || p.role === 'coach') && p.userId !== asker).map((p) => p.userId));
        expect(new Set(got)).toEqual(expected);
      }),
    );
  });
});

describe('when a hand-off is possible', () => {
  it('a draft or a published class can be handed off; an archived one cannot', () => {
    expect(reviewRequestRefusal('draft')).toBeNull();
    expect(reviewRequestRefusal('published')).toBeNull();
    expect(reviewRequestRefusal('archived')).toMatch(/archived class cannot be marked ready/);
  });
  it('only an open hand-off can be sent back', () => {
    expect(sendBackRefusal(true)).toBeNull();
    expect(sendBackRefusal(false)).toMatch(/not waiting for review/);
  });
});

describe('the notes', () => {
  it('a hand-off note is optional, trimmed, at most 1,000 characters, and holds no control characters', () => {
    expect(readyForReviewInput.parse({})).toEqual({ note: '' });
    expect(readyForReviewInput.parse({ note: '  Round 3 is short.\nCheck the cue at 4:10. ' })).toEqual({ note: 'Round 3 is short.\nCheck the cue at 4:10.' });
    expect(readyForReviewInput.safeParse({ note: 'x'.repeat(1001) }).error?.issues[0]?.message).toBe('The note can be at most 1,000 characters.');
    expect(readyForReviewInput.safeParse({ note: 'a\u0000b' }).error?.issues[0]?.message).toMatch(/control character/);
    expect(readyForReviewInput.safeParse({ note: 42 }).error?.issues[0]?.message).toBe('The note must be text.');
  });
  it('sending back needs a note that says what to change', () => {
    expect(sendBackInput.safeParse({ note: '   ' }).error?.issues[0]?.message).toMatch(/^Say what needs another look/);
    expect(sendBackInput.safeParse({}).success).toBe(false);
    expect(sendBackInput.parse({ note: 'Round 2 is missing.' })).toEqual({ note: 'Round 2 is missing.' });
  });
});

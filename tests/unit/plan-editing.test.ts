import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { BLOCK_KINDS, draftBlockSeconds, duplicateItem, emptyPlan, messagesByPath, moveItem, newBlock, removeItem } from '~/lib/plan/plan-editing';
import { compareWithAdvertised } from '~/lib/plan/advertised-length';
import { planSchema } from '~/lib/plan/plan-schema';

describe('plan editing helpers', () => {
  it('moves, duplicates and removes without losing or inventing items', () => {
    fc.assert(
      fc.property(fc.array(fc.integer(), { minLength: 1, maxLength: 12 }), fc.nat(), fc.integer({ min: -3, max: 15 }), (items, fromSeed, to) => {
        const from = fromSeed % items.length;
        const moved = moveItem(items, from, to);
        expect([...moved].sort()).toEqual([...items].sort());
        expect(moved[Math.max(0, Math.min(items.length - 1, to))]).toBe(items[from]);
        const dup = duplicateItem(items, from);
        expect(dup).toHaveLength(items.length + 1);
        expect(dup[from + 1]).toEqual(items[from]);
        expect(removeItem(items, from)).toEqual(items.filter((_, i) => i !== from));
      }),
    );
  });

  it('a duplicated block is a copy, not the same object', () => {
    const blocks = [newBlock('circuit')];
    const dup = duplicateItem(blocks, 0);
    expect(dup[1]).not.toBe(dup[0]);
  });

  it('new blocks of every kind are valid once their exercise names are filled in', () => {
    for (const kind of BLOCK_KINDS) {
      const b = newBlock(kind);
      if (b.kind === 'circuit') b.stations = b.stations.map((s, i) => ({ ...s, exercise: `Move ${i}` }));
      if (b.kind === 'intervals') b.exercise = 'Move';
      if (b.kind === 'amrap' || b.kind === 'emom') b.exercises = b.exercises.map((_, i) => `Move ${i}`);
      expect(planSchema.safeParse({ blocks: [b] }).success, kind).toBe(true);
    }
    expect(planSchema.safeParse(emptyPlan()).success).toBe(true);
  });

  it("gives the schema's own messages keyed by field path", () => {
    const parsed = planSchema.safeParse({ blocks: [{ kind: 'circuit', rounds: 0, stations: [{ exercise: '', workSeconds: 0, restSeconds: 5 }] }] });
    expect(parsed.success).toBe(false);
    const fields = messagesByPath(parsed.error!.issues);
    expect(fields['blocks.0.rounds']).toBe('A circuit needs at least 1 round.');
    expect(fields['blocks.0.stations.0.exercise']).toBe('The exercise needs a name.');
    expect(fields['blocks.0.stations.0.workSeconds']).toBe('Work must be more than 0 seconds.');
    const empty = planSchema.safeParse({ blocks: [{ kind: 'warmup' }] });
    expect(messagesByPath(empty.error!.issues)['blocks.0.seconds']).toBe('The warm-up must be a number of seconds.');
  });

  it('a block being typed has no length until it is valid', () => {
    expect(draftBlockSeconds({ kind: 'warmup', seconds: Number.NaN }, undefined)).toBeNull();
    // Six stations × (45 s + 15 s) × 3 rounds = 18 min (common practice, no source); with the
    // defaults the last rest of rounds 1–2 is replaced by the (0 s) round break and the final
    // rest is dropped: 1080 − 3 × 15 = 1035 s.
    const circuit = { kind: 'circuit' as const, rounds: 3, stations: Array.from({ length: 6 }, (_, i) => ({ exercise: `S${i}`, workSeconds: 45, restSeconds: 15 })) };
    expect(draftBlockSeconds(circuit, { roundBreakReplacesLastRest: false, dropFinalRest: false })).toBe(1080);
    expect(draftBlockSeconds(circuit, undefined)).toBe(1035);
  });
});

describe('advertised length rule (house rule: ± percent of the advertised minutes)', () => {
  it.each([
    // 30 min ± 10 % = 27:00 … 33:00 inclusive.
    [27 * 60, 30, 10, true],
    [33 * 60, 30, 10, true],
    [33 * 60 + 0.01, 30, 10, false],
    [26 * 60 + 59, 30, 10, false],
    [19 * 60, 25, 10, false],
  ])('%s s against %s min ± %s %% → within %s', (seconds, minutes, percent, within) => {
    expect(compareWithAdvertised(seconds, minutes, percent)?.within).toBe(within);
  });
  it('no advertised length, no comparison', () => {
    expect(compareWithAdvertised(100, 0, 10)).toBeNull();
    expect(compareWithAdvertised(100, null, 10)).toBeNull();
  });
});

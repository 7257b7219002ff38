import { describe, expect, it } from 'vitest';
import { renameExerciseInPlan } from '~/lib/plan/rename-exercise';

describe('renameExerciseInPlan', () => {
  it('renames every exercise and exercises entry of that name, any case, and leaves the input untouched', () => {
    const plan = {
      blocks: [
        { kind: 'intervals', exercise: 'PLANK', sets: 2 },
        { kind: 'circuit', stations: [{ exercise: 'plank ', workSeconds: 20 }, { exercise: 'Squat', workSeconds: 20 }] },
        { kind: 'future-kind', exercises: ['Plank', 'Row'] },
      ],
    };
    const copy = structuredClone(plan);
    const out = renameExerciseInPlan(plan, 'Plank', 'Forearm plank');
    expect(out.changed).toBe(true);
    expect(out.plan).toEqual({
      blocks: [
        { kind: 'intervals', exercise: 'Forearm plank', sets: 2 },
        { kind: 'circuit', stations: [{ exercise: 'Forearm plank', workSeconds: 20 }, { exercise: 'Squat', workSeconds: 20 }] },
        { kind: 'future-kind', exercises: ['Forearm plank', 'Row'] },
      ],
    });
    expect(plan).toEqual(copy);
  });

  it('answers the same value and changed=false when the name is absent, and copes with null', () => {
    const plan = { blocks: [{ kind: 'talk', seconds: 30, title: 'Plank' }] };
    expect(renameExerciseInPlan(plan, 'Plank', 'X')).toEqual({ plan, changed: false });
    expect(renameExerciseInPlan(null, 'Plank', 'X')).toEqual({ plan: null, changed: false });
  });
});

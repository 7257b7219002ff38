/**
 * Renames one exercise inside a stored plan, whatever its block kinds: every string under a key
 * named `exercise`, and every string in an array under `exercises`, that equals `from` ignoring
 * case becomes `to`. Walking the JSON rather than the known kinds keeps a merge correct when new
 * block kinds name their moves the same way. Pure: answers a new value, the input is untouched.
 */
export function renameExerciseInPlan(plan: unknown, from: string, to: string): { plan: unknown; changed: boolean } {
  const match = from.trim().toLowerCase();
  let changed = false;
  const same = (v: unknown) => typeof v === 'string' && v.trim().toLowerCase() === match;
  const walk = (value: unknown): unknown => {
    if (Array.isArray(value)) return value.map(walk);
    if (value === null || typeof value !== 'object') return value;
    const out: Record<string, unknown> = {};
    for (const [key, v] of Object.entries(value)) {
      if (key === 'exercise' && same(v)) {
        out[key] = to;
        changed = true;
      } else if (key === 'exercises' && Array.isArray(v)) {
        out[key] = v.map((item) => {
          if (!same(item)) return walk(item);
          changed = true;
          return to;
        });
      } else out[key] = walk(v);
    }
    return out;
  };
  const renamed = walk(plan);
  return { plan: changed ? renamed : plan, changed };
}

import type { DraftBlock } from '~/lib/plan/plan-editing';
import { duplicateItem, moveItem, removeItem } from '~/lib/plan/plan-editing';
import { ExerciseField } from './ExerciseField';
import { NumberField, smallButton } from './fields';

type Circuit = Extract<DraftBlock, { kind: 'circuit' }>;
type Station = Circuit['stations'][number];
type RoundChange = NonNullable<Circuit['roundChanges']>[number];

export interface BlockEditorProps {
  block: DraftBlock;
  /** Field path prefix of this block, e.g. `blocks.2`. */
  path: string;
  fields: Record<string, string>;
  exerciseListId: string;
  knownExercises: ReadonlySet<string>;
  onChange(block: DraftBlock): void;
}

/** The fields of one block, by kind. */
export default function BlockEditor(p: BlockEditorProps) {
  const b = p.block;
  const err = (name: string) => p.fields[`${p.path}.${name}`];
  switch (b.kind) {
    case 'warmup':
    case 'cooldown':
    case 'talk':
      return (
        <div className="grid gap-3 sm:grid-cols-2">
          <NumberField label="Length (seconds)" value={b.seconds} onChange={(v) => p.onChange({ ...b, seconds: v as number })} error={err('seconds')} />
        </div>
      );
    case 'intervals':
      return (
        <div className="grid gap-3 sm:grid-cols-4">
          <div className="sm:col-span-4">
            <ExerciseField label="Exercise" value={b.exercise ?? ''} onChange={(v) => p.onChange({ ...b, exercise: v })} error={err('exercise')} listId={p.exerciseListId} known={p.knownExercises} />
          </div>
          <NumberField label="Sets" value={b.sets} onChange={(v) => p.onChange({ ...b, sets: v as number })} error={err('sets')} min={1} />
          <NumberField label="Work (s)" value={b.workSeconds} onChange={(v) => p.onChange({ ...b, workSeconds: v as number })} error={err('workSeconds')} min={1} />
          <NumberField label="Rest (s)" value={b.restSeconds} onChange={(v) => p.onChange({ ...b, restSeconds: v as number })} error={err('restSeconds')} />
          <PerSideFields value={b} error={err('switchSeconds')} onChange={(next) => p.onChange(withSides(b, next))} hint="Each set: left, pause, then right." />
        </div>
      );
    case 'circuit':
      return <CircuitEditor {...p} block={b} />;
    case 'amrap':
      return (
        <div className="flex flex-col gap-3">
          <p className="text-sm text-ink-soft">As many rounds as possible: one timed span in which members repeat these exercises at their own pace.</p>
          <div className="grid gap-3 sm:grid-cols-3">
            <NumberField label="Length (seconds)" value={b.seconds} onChange={(v) => p.onChange({ ...b, seconds: v as number })} error={err('seconds')} min={1} hint="12 minutes = 720" />
          </div>
          <ExerciseList {...p} legend="Exercises of one round" exercises={b.exercises} onExercises={(exercises) => p.onChange({ ...b, exercises })} />
        </div>
      );
    case 'emom':
      return (
        <div className="flex flex-col gap-3">
          <p className="text-sm text-ink-soft">Every minute on the minute: work starts at the top of each minute and the rest of the minute is rest. The exercises take turns, one per minute.</p>
          <div className="grid gap-3 sm:grid-cols-3">
            <NumberField label="Minutes" value={b.minutes} onChange={(v) => p.onChange({ ...b, minutes: v as number })} error={err('minutes')} min={1} />
            <NumberField label="Work each minute (s)" value={b.workSeconds} onChange={(v) => p.onChange({ ...b, workSeconds: v as number })} error={err('workSeconds')} min={1} hint="A guide for laying out the marks; the check tests the minute boundaries." />
          </div>
          <ExerciseList {...p} legend="Exercises, one per minute in turn" exercises={b.exercises} onExercises={(exercises) => p.onChange({ ...b, exercises })} />
        </div>
      );
  }
}

/** The exercises of an AMRAP or EMOM: type-ahead names, added and removed in place. */
function ExerciseList(p: BlockEditorProps & { legend: string; exercises: string[] | undefined; onExercises(exercises: string[]): void }) {
  const list = p.exercises ?? [];
  const err = (name: string) => p.fields[`${p.path}.${name}`];
  return (
    <fieldset className="flex flex-col gap-2" data-exercise-list>
      <legend className="text-sm font-bold">{p.legend}</legend>
      {err('exercises') && <p className="text-sm font-semibold text-error" data-field-error>{err('exercises')}</p>}
      <ol className="flex flex-col gap-2">
        {list.map((name, i) => (
          <li key={i} className="grid items-start gap-2 sm:grid-cols-[minmax(0,1fr)_auto]">
            <ExerciseField
              label={`Exercise ${i + 1}`}
              value={name}
              onChange={(v) => p.onExercises(list.map((x, j) => (j === i ? v : x)))}
              error={err(`exercises.${i}`)}
              listId={p.exerciseListId}
              known={p.knownExercises}
            />
            <button type="button" className={`${smallButton} self-end`} onClick={() => p.onExercises(removeItem(list, i))} aria-label={`Remove exercise ${i + 1}`}>Remove</button>
          </li>
        ))}
      </ol>
      <div>
        <button type="button" className={smallButton} onClick={() => p.onExercises([...list, ''])}>Add exercise</button>
      </div>
    </fieldset>
  );
}

function CircuitEditor(p: BlockEditorProps & { block: Circuit }) {
  const b = p.block;
  const err = (name: string) => p.fields[`${p.path}.${name}`];
  const setStations = (stations: Station[]) => p.onChange({ ...b, stations });
  const setStation = (i: number, s: Station) => setStations(b.stations.map((x, j) => (j === i ? s : x)));
  const last = b.stations[b.stations.length - 1];
  return (
    <div className="flex flex-col gap-3">
      <div className="grid gap-3 sm:grid-cols-3">
        <NumberField label="Rounds" value={b.rounds} onChange={(v) => p.onChange({ ...b, rounds: v as number })} error={err('rounds')} min={1} />
        <NumberField label="Round break (s)" value={b.roundBreakSeconds} onChange={(v) => p.onChange({ ...b, roundBreakSeconds: v })} error={err('roundBreakSeconds')} />
      </div>
      <fieldset className="flex flex-col gap-2">
        <legend className="text-sm font-bold">Stations</legend>
        {err('stations') && <p className="text-sm font-semibold text-error" data-field-error>{err('stations')}</p>}
        <ol className="flex flex-col gap-2">
          {b.stations.map((s, i) => (
            <li key={i} className="grid items-start gap-2 rounded-[10px] border border-stone/60 p-2 sm:grid-cols-[minmax(0,1fr)_6rem_6rem_8rem_auto]" data-station>
              <ExerciseField
                label={`Station ${i + 1}`}
                value={s.exercise ?? ''}
                onChange={(v) => setStation(i, { ...s, exercise: v })}
                error={err(`stations.${i}.exercise`)}
                listId={p.exerciseListId}
                known={p.knownExercises}
              />
              <NumberField label="Work (s)" value={s.workSeconds} onChange={(v) => setStation(i, { ...s, workSeconds: v as number })} error={err(`stations.${i}.workSeconds`)} min={1} />
              <NumberField label="Rest (s)" value={s.restSeconds} onChange={(v) => setStation(i, { ...s, restSeconds: v as number })} error={err(`stations.${i}.restSeconds`)} />
              <PerSideFields value={s} error={err(`stations.${i}.switchSeconds`)} hint="Left, pause, then right." onChange={(next) => setStation(i, withSides(s, next))} />
              <div className="flex flex-wrap gap-1 self-end pb-1">
                <button type="button" className={smallButton} onClick={() => setStations(moveItem(b.stations, i, i - 1))} disabled={i === 0} aria-label={`Move station ${i + 1} up`}>↑</button>
                <button type="button" className={smallButton} onClick={() => setStations(moveItem(b.stations, i, i + 1))} disabled={i === b.stations.length - 1} aria-label={`Move station ${i + 1} down`}>↓</button>
                <button type="button" className={smallButton} onClick={() => setStations(duplicateItem(b.stations, i))} aria-label={`Copy station ${i + 1}`}>Copy</button>
                <button type="button" className={smallButton} onClick={() => setStations(removeItem(b.stations, i))} aria-label={`Remove station ${i + 1}`}>Remove</button>
              </div>
            </li>
          ))}
        </ol>
        <div>
          <button
            type="button"
            className={smallButton}
            onClick={() => setStations([...b.stations, { exercise: '', workSeconds: last?.workSeconds ?? 40, restSeconds: last?.restSeconds ?? 20 }])}
          >
            Add station
          </button>
        </div>
      </fieldset>
      <RoundChanges {...p} block={b} />
    </div>
  );
}

type PerSide = { perSide?: boolean | undefined; switchSeconds?: number | undefined };

/**
 * "Per side" (left, then right, each for the work seconds) and the pause to switch sides, for a
 * station or an intervals block. `onChange` gets the two fields (left out when not per side).
 */
function PerSideFields(p: { value: PerSide; error: string | undefined; hint: string; onChange(next: PerSide): void }) {
  const s = p.value;
  return (
    <div className="flex flex-col gap-1" data-per-side>
      <label className="inline-flex items-center gap-2 pt-6 text-sm font-semibold">
        <input
          type="checkbox"
          className="h-4 w-4 accent-ink"
          checked={s.perSide === true}
          onChange={(e) => {
            // A 5 s pause to change sides is a starting value (common practice, no source); the coach edits it.
            p.onChange(e.target.checked ? { perSide: true, switchSeconds: s.switchSeconds ?? 5 } : { perSide: undefined, switchSeconds: undefined });
          }}
        />
        Per side
      </label>
      {s.perSide === true && (
        <NumberField label="Switch pause (s)" value={s.switchSeconds} onChange={(v) => p.onChange({ perSide: true, switchSeconds: v })} error={p.error} hint={p.hint} />
      )}
    </div>
  );
}

/** Drops the per-side fields a coach turned off, so the saved plan has no empty keys. */
function withSides<T extends PerSide>(item: T, next: PerSide): T {
  const { perSide: _perSide, switchSeconds: _switch, ...rest } = item;
  return { ...rest, ...(next.perSide ? { perSide: true, switchSeconds: next.switchSeconds } : {}) } as T;
}

/**
 * Rounds that differ: their own work/rest seconds (ladders, pyramids) or stations they leave
 * out. Empty seconds mean "as each station has it".
 */
function RoundChanges(p: BlockEditorProps & { block: Circuit }) {
  const b = p.block;
  const changes = b.roundChanges ?? [];
  const err = (name: string) => p.fields[`${p.path}.roundChanges.${name}`];
  const set = (next: RoundChange[]) => p.onChange({ ...b, roundChanges: next.length > 0 ? next : undefined });
  const setChange = (i: number, c: RoundChange) => set(changes.map((x, j) => (j === i ? c : x)));
  const nextRound = () => {
    const used = new Set(changes.map((c) => c.round));
    for (let r = 1; r <= (b.rounds ?? 1); r++) if (!used.has(r)) return r;
    return (b.rounds ?? 1) + 1;
  };
  return (
    <fieldset className="flex flex-col gap-2" data-round-changes>
      <legend className="text-sm font-bold">Rounds that differ</legend>
      <p className="text-sm text-ink-soft">For a ladder or pyramid give a round its own work or rest; leave stations out of a round that skips them. Empty seconds keep each station’s own.</p>
      {changes.map((c, i) => (
        <div key={i} className="grid items-start gap-2 rounded-[10px] border border-stone/60 p-2 sm:grid-cols-[6rem_7rem_7rem_minmax(0,1fr)_auto]" data-round-change>
          <NumberField label="Round" value={c.round} onChange={(v) => setChange(i, { ...c, round: v as number })} error={err(`${i}.round`)} min={1} />
          <NumberField label="Work (s)" value={c.workSeconds} onChange={(v) => setChange(i, { ...c, workSeconds: v })} error={err(`${i}.workSeconds`)} min={1} />
          <NumberField label="Rest (s)" value={c.restSeconds} onChange={(v) => setChange(i, { ...c, restSeconds: v })} error={err(`${i}.restSeconds`)} />
          <fieldset className="flex flex-col gap-1">
            <legend className="text-sm font-semibold">Leave out</legend>
            <div className="flex flex-wrap gap-x-3 gap-y-1">
              {b.stations.map((s, k) => {
                const n = k + 1;
                const skipped = c.skipStations?.includes(n) ?? false;
                return (
                  <label key={k} className="inline-flex items-center gap-1 text-sm">
                    <input
                      type="checkbox"
                      className="h-4 w-4 accent-ink"
                      checked={skipped}
                      onChange={(e) => {
                        const rest = (c.skipStations ?? []).filter((x) => x !== n);
                        const skipStations = e.target.checked ? [...rest, n].sort((x, y) => x - y) : rest;
                        setChange(i, { ...c, skipStations: skipStations.length > 0 ? skipStations : undefined });
                      }}
                    />
                    {n}. {s.exercise || 'unnamed'}
                  </label>
                );
              })}
            </div>
            {err(`${i}.skipStations`) && <p className="text-sm font-semibold text-error" data-field-error>{err(`${i}.skipStations`)}</p>}
          </fieldset>
          <button type="button" className={`${smallButton} self-end`} onClick={() => set(changes.filter((_, j) => j !== i))} aria-label={`Remove the change to round ${c.round}`}>
            Remove
          </button>
        </div>
      ))}
      <div>
        <button type="button" className={smallButton} onClick={() => set([...changes, { round: nextRound() }])}>
          Change a round
        </button>
      </div>
    </fieldset>
  );
}

import { useId, useMemo, useState } from 'react';
import type { ExerciseOutput, MergeExercisesOutput } from '~/lib/api/exercise-schemas';
import { ApiError } from '../api-client';
import { FieldError, inputClass, smallButton } from '../plan-builder/fields';
import { exerciseApi } from './exercise-api';
import { ExerciseEditor } from './ExerciseEditor';
import { MergeExercises } from './MergeExercises';

const byName = (a: ExerciseOutput, b: ExerciseOutput) => a.name.localeCompare(b.name, 'en', { sensitivity: 'base' });

/** Whether an exercise matches the search words (name, focus, cautions or options; any case). */
function matches(e: ExerciseOutput, query: string): boolean {
  const words = query.trim().toLowerCase().split(/\s+/).filter(Boolean);
  const text = [e.name, e.focus, e.cautions, e.easierOption, e.harderOption].filter(Boolean).join(' ').toLowerCase();
  return words.every((w) => text.includes(w));
}

/** The studio's Exercises page: search, add, edit cautions and options, merge two names. */
export default function ExerciseLibrary(p: { initial: ExerciseOutput[] }) {
  const id = useId();
  const [list, setList] = useState(() => [...p.initial].sort(byName));
  const [query, setQuery] = useState('');
  const [editing, setEditing] = useState<string | null>(null);
  const [status, setStatus] = useState('');
  const [newName, setNewName] = useState('');
  const [addError, setAddError] = useState('');
  const shown = useMemo(() => list.filter((e) => matches(e, query)), [list, query]);

  const replace = (saved: ExerciseOutput) => setList((l) => l.map((e) => (e.id === saved.id ? saved : e)).sort(byName));

  async function add() {
    setAddError('');
    try {
      const added = await exerciseApi.add(newName);
      setList((l) => [...l, added].sort(byName));
      setNewName('');
      setStatus(`Added “${added.name}”.`);
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      setAddError(err.fields?.name ?? err.message);
    }
  }

  function merged(result: MergeExercisesOutput) {
    setList((l) => l.filter((e) => e.name !== result.mergedName).map((e) => (e.id === result.kept.id ? result.kept : e)));
    setStatus(
      `Merged “${result.mergedName}” into “${result.kept.name}”: ${result.classesChanged} ${result.classesChanged === 1 ? 'class' : 'classes'} and ${result.templatesChanged} ${result.templatesChanged === 1 ? 'template' : 'templates'} now say “${result.kept.name}”.`,
    );
  }

  return (
    <div className="flex flex-col gap-6">
      {status && <p role="status" className="rounded-[10px] bg-mint/10 p-3 font-semibold text-mint-deep">{status}</p>}
      <section className="card p-4 sm:p-6" aria-labelledby={`${id}-list`}>
        <h2 id={`${id}-list`} className="mb-3 text-xl">All exercises</h2>
        <div className="mb-4 flex flex-col gap-1">
          <label htmlFor={`${id}-search`} className="text-sm font-semibold">Search</label>
          <input id={`${id}-search`} type="search" className={inputClass} value={query} onChange={(e) => setQuery(e.target.value)} placeholder="Name, focus or caution" />
          <p className="text-sm text-ink-soft" aria-live="polite">{shown.length} of {list.length} shown</p>
        </div>
        <ul className="divide-y divide-stone/40">
          {shown.map((e) => (
            <li key={e.id} className="py-3" data-exercise={e.name}>
              <div className="flex flex-wrap items-start justify-between gap-2">
                <div className="min-w-0">
                  <p className="font-semibold">{e.name}</p>
                  {e.cautions ? <p className="text-sm"><span className="font-semibold">Cautions: </span>{e.cautions}</p> : <p className="text-sm text-ink-soft">No cautions written yet.</p>}
                  {(e.easierOption || e.harderOption) && (
                    <p className="text-sm text-ink-soft">
                      {e.easierOption && <>Easier: {e.easierOption}. </>}
                      {e.harderOption && <>Harder: {e.harderOption}.</>}
                    </p>
                  )}
                </div>
                {editing !== e.id && (
                  <button type="button" className={smallButton} aria-label={`Edit ${e.name}`} onClick={() => { setEditing(e.id); setStatus(''); }}>Edit</button>
                )}
              </div>
              {editing === e.id && (
                <ExerciseEditor
                  exercise={e}
                  onCancel={() => setEditing(null)}
                  onSaved={(saved) => { replace(saved); setEditing(null); setStatus(`Saved “${saved.name}”.`); }}
                />
              )}
            </li>
          ))}
          {shown.length === 0 && <li className="py-3 text-ink-soft">No exercise matches “{query}”.</li>}
        </ul>
      </section>
      <div className="grid gap-6 lg:grid-cols-2">
        <section className="card p-4 sm:p-6" aria-labelledby={`${id}-add`}>
          <h2 id={`${id}-add`} className="mb-3 text-xl">Add an exercise</h2>
          <form className="flex flex-col gap-2" onSubmit={(ev) => { ev.preventDefault(); void add(); }}>
            <label htmlFor={`${id}-new`} className="text-sm font-semibold">Name</label>
            <input id={`${id}-new`} className={inputClass} value={newName} onChange={(ev) => setNewName(ev.target.value)} aria-invalid={addError ? 'true' : undefined} aria-describedby={addError ? `${id}-new-error` : undefined} />
            <FieldError id={`${id}-new-error`} message={addError} />
            <button type="submit" className={`${smallButton} self-start`}>Add exercise</button>
          </form>
        </section>
        <section className="card p-4 sm:p-6" aria-labelledby={`${id}-merge`}>
          <h2 id={`${id}-merge`} className="mb-3 text-xl">Merge two names</h2>
          <MergeExercises exercises={list} onMerged={merged} />
        </section>
      </div>
    </div>
  );
}

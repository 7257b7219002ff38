import { useId, useState } from 'react';
import type { ExerciseOutput, ExerciseUsageOutput, MergeExercisesOutput } from '~/lib/api/exercise-schemas';
import { ApiError } from '../api-client';
import { FieldError, inputClass, smallButton } from '../plan-builder/fields';
import { exerciseApi } from './exercise-api';

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * Merging two names into one, in two steps: choose the pair and review where the merged name is
 * used, then confirm. Nothing changes before the confirmation.
 */
export function MergeExercises(p: { exercises: ExerciseOutput[]; onMerged(result: MergeExercisesOutput): void }) {
  const id = useId();
  const [fromId, setFromId] = useState('');
  const [intoId, setIntoId] = useState('');
  const [review, setReview] = useState<{ usage: ExerciseUsageOutput; from: ExerciseOutput; into: ExerciseOutput } | null>(null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState('');
  const [busy, setBusy] = useState(false);
  const byId = (value: string) => p.exercises.find((e) => e.id === value);

  async function reviewMerge() {
    const from = byId(fromId);
    const into = byId(intoId);
    const problems: Record<string, string> = {};
    if (!from) problems.fromId = 'Choose the name to merge away.';
    if (!into) problems.intoId = 'Choose the name to keep.';
    else if (from && from.id === into.id) problems.intoId = 'Choose two different names: one to keep and one to merge into it.';
    setErrors(problems);
    setMessage('');
    if (!from || !into || Object.keys(problems).length) return;
    setBusy(true);
    try {
      setReview({ usage: await exerciseApi.usage(from.id), from, into });
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      setMessage(err.message);
    } finally {
      setBusy(false);
    }
  }

  async function confirm() {
    if (!review) return;
    setBusy(true);
    try {
      const result = await exerciseApi.merge(review.from.id, review.into.id);
      setReview(null);
      setFromId('');
      setIntoId('');
      p.onMerged(result);
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      setReview(null);
      setMessage(err.message);
    } finally {
      setBusy(false);
    }
  }

  const select = (value: string, onChange: (v: string) => void, label: string, key: 'fromId' | 'intoId') => (
    <div className="flex min-w-0 flex-1 flex-col gap-1">
      <label htmlFor={`${id}-${key}`} className="text-sm font-semibold">{label}</label>
      <select
        id={`${id}-${key}`}
        className={inputClass}
        value={value}
        disabled={!!review}
        onChange={(e) => onChange(e.target.value)}
        aria-invalid={errors[key] ? 'true' : undefined}
        aria-describedby={errors[key] ? `${id}-${key}-error` : undefined}
      >
        <option value="">Choose…</option>
        {p.exercises.map((e) => <option key={e.id} value={e.id}>{e.name}</option>)}
      </select>
      <FieldError id={`${id}-${key}-error`} message={errors[key]} />
    </div>
  );

  return (
    <div className="flex flex-col gap-3" data-merge-exercises>
      <p className="text-sm text-ink-soft">
        Two names for the same move? Merge them: every class plan, every marked segment and every studio template that uses the first name uses the kept one instead. Classes already published keep their words until you publish them again.
      </p>
      <div className="flex flex-col gap-3 sm:flex-row">
        {select(fromId, setFromId, 'Merge this name…', 'fromId')}
        {select(intoId, setIntoId, '…into this one (kept)', 'intoId')}
      </div>
      {!review && (
        <button type="button" disabled={busy} className={`${smallButton} self-start`} onClick={() => void reviewMerge()}>Review the merge</button>
      )}
      {message && <p role="alert" className="font-semibold text-error">{message}</p>}
      {review && (
        <div role="alertdialog" aria-labelledby={`${id}-confirm-title`} aria-describedby={`${id}-confirm-body`} className="rounded-[10px] border-2 border-sun bg-sun/10 p-4" data-merge-confirm>
          <h3 id={`${id}-confirm-title`} className="font-bold">Merge “{review.from.name}” into “{review.into.name}”?</h3>
          <div id={`${id}-confirm-body`} className="mt-2 flex flex-col gap-2 text-sm">
            <p>
              “{review.from.name}” is used in {plural(review.usage.classes.length, 'class', 'classes')} and {plural(review.usage.templates.length, 'studio template', 'studio templates')}. They will say “{review.into.name}”.
            </p>
            {review.usage.classes.length > 0 && (
              <ul className="list-disc pl-5">{review.usage.classes.map((c) => <li key={c.id}>{c.title}</li>)}</ul>
            )}
            {review.usage.templates.length > 0 && (
              <ul className="list-disc pl-5">{review.usage.templates.map((t) => <li key={t.id}>Template: {t.name}</li>)}</ul>
            )}
            <p>“{review.from.name}” leaves the list; its cautions and options fill any that “{review.into.name}” has left blank. This cannot be undone.</p>
          </div>
          <div className="mt-3 flex gap-2">
            <button type="button" disabled={busy} className="rounded-[10px] bg-ember-deep px-4 py-2 font-bold text-white disabled:opacity-60" onClick={() => void confirm()}>
              Merge the names
            </button>
            <button type="button" className={smallButton} onClick={() => setReview(null)}>Cancel</button>
          </div>
        </div>
      )}
    </div>
  );
}

import { useId, useState } from 'react';
import type { ExerciseOutput } from '~/lib/api/exercise-schemas';
import { ApiError } from '../api-client';
import { FieldError, inputClass, smallButton } from '../plan-builder/fields';
import { exerciseApi } from './exercise-api';

const TEXT_FIELDS = [
  { key: 'cautions', label: 'Cautions', hint: 'Shown to members while this exercise is on, e.g. what to avoid with sore knees.', rows: 3 },
  { key: 'easierOption', label: 'Easier option', hint: 'What to do instead when the move is too much today.', rows: 2 },
  { key: 'harderOption', label: 'Harder option', hint: 'A step up for people who find it easy.', rows: 2 },
] as const;
type TextKey = (typeof TEXT_FIELDS)[number]['key'];

/** The edit form of one exercise: its name, cautions and easier/harder options. */
export function ExerciseEditor(p: { exercise: ExerciseOutput; onSaved(e: ExerciseOutput): void; onCancel(): void }) {
  const id = useId();
  const [name, setName] = useState(p.exercise.name);
  const [texts, setTexts] = useState<Record<TextKey, string>>({
    cautions: p.exercise.cautions ?? '',
    easierOption: p.exercise.easierOption ?? '',
    harderOption: p.exercise.harderOption ?? '',
  });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState('');
  const [busy, setBusy] = useState(false);

  async function save() {
    setBusy(true);
    setMessage('');
    try {
      const blank = (v: string) => (v.trim() === '' ? null : v);
      const saved = await exerciseApi.edit({
        id: p.exercise.id,
        name,
        cautions: blank(texts.cautions),
        easierOption: blank(texts.easierOption),
        harderOption: blank(texts.harderOption),
      });
      p.onSaved(saved);
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      setErrors(err.fields ?? {});
      setMessage(err.fields && Object.keys(err.fields).length ? '' : err.message);
    } finally {
      setBusy(false);
    }
  }

  return (
    <form
      className="mt-3 flex flex-col gap-3"
      aria-label={`Edit ${p.exercise.name}`}
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
    >
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-name`} className="text-sm font-semibold">Name</label>
        <input id={`${id}-name`} className={inputClass} value={name} onChange={(e) => setName(e.target.value)} aria-invalid={errors.name ? 'true' : undefined} aria-describedby={errors.name ? `${id}-name-error` : undefined} />
        <FieldError id={`${id}-name-error`} message={errors.name} />
      </div>
      {TEXT_FIELDS.map((f) => (
        <div key={f.key} className="flex flex-col gap-1">
          <label htmlFor={`${id}-${f.key}`} className="text-sm font-semibold">{f.label}</label>
          <textarea
            id={`${id}-${f.key}`}
            rows={f.rows}
            className={inputClass}
            value={texts[f.key]}
            onChange={(e) => setTexts({ ...texts, [f.key]: e.target.value })}
            aria-invalid={errors[f.key] ? 'true' : undefined}
            aria-describedby={`${id}-${f.key}-hint${errors[f.key] ? ` ${id}-${f.key}-error` : ''}`}
          />
          <p id={`${id}-${f.key}-hint`} className="text-sm text-ink-soft">{f.hint}</p>
          <FieldError id={`${id}-${f.key}-error`} message={errors[f.key]} />
        </div>
      ))}
      {message && <p role="alert" className="font-semibold text-error">{message}</p>}
      <div className="flex gap-2">
        <button type="submit" disabled={busy} className="rounded-[10px] bg-ink px-4 py-2 font-bold text-paper hover:bg-ink/90 disabled:opacity-60">Save exercise</button>
        <button type="button" className={smallButton} onClick={p.onCancel}>Cancel</button>
      </div>
    </form>
  );
}

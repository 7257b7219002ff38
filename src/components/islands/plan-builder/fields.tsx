import { useId, type ReactNode } from 'react';

export const inputClass = 'w-full rounded-[10px] border border-slate bg-chalk px-3 py-2 tabular aria-[invalid=true]:border-error';
export const smallButton =
  'rounded-[10px] border border-ink/70 px-2.5 py-1 text-sm font-bold hover:bg-ink hover:text-paper disabled:opacity-40 disabled:hover:bg-transparent disabled:hover:text-ink';

/** The schema's message for one field, tied to its input by id. */
export function FieldError({ id, message }: { id: string; message: string | undefined }) {
  if (!message) return null;
  return (
    <p id={id} className="text-sm font-semibold text-error" data-field-error>
      {message}
    </p>
  );
}

/** A whole-number field; empty means "not given" so the schema's own message shows. */
export function NumberField(p: {
  label: string;
  value: number | undefined;
  onChange(value: number | undefined): void;
  error?: string;
  hint?: ReactNode;
  min?: number;
  step?: number;
  className?: string;
}) {
  const id = useId();
  const errorId = `${id}-error`;
  const hintId = `${id}-hint`;
  return (
    <div className={`flex flex-col gap-1 ${p.className ?? ''}`}>
      <label htmlFor={id} className="text-sm font-semibold">{p.label}</label>
      <input
        id={id}
        type="number"
        inputMode="numeric"
        min={p.min ?? 0}
        step={p.step ?? 1}
        className={inputClass}
        value={p.value === undefined || Number.isNaN(p.value) ? '' : p.value}
        onChange={(e) => p.onChange(e.target.value === '' ? undefined : Number(e.target.value))}
        aria-invalid={p.error ? 'true' : undefined}
        aria-describedby={[p.error ? errorId : '', p.hint ? hintId : ''].filter(Boolean).join(' ') || undefined}
      />
      {p.hint && <p id={hintId} className="text-sm text-ink-soft">{p.hint}</p>}
      <FieldError id={errorId} message={p.error} />
    </div>
  );
}

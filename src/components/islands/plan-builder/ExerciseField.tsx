import { useId } from 'react';
import { FieldError, inputClass } from './fields';

/**
 * An exercise name with type-ahead from the studio's exercise library (a native datalist, so
 * it works with keyboard and screen readers). A name the library lacks is marked "new": the
 * save adds it to the library.
 */
export function ExerciseField(p: { label: string; value: string; onChange(value: string): void; error?: string; listId: string; known: ReadonlySet<string> }) {
  const id = useId();
  const name = p.value.trim();
  const isNew = name.length > 0 && !p.known.has(name.toLowerCase());
  return (
    <div className="flex min-w-0 flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold">{p.label}</label>
      <input
        id={id}
        type="text"
        list={p.listId}
        autoComplete="off"
        className={inputClass}
        value={p.value}
        onChange={(e) => p.onChange(e.target.value)}
        aria-invalid={p.error ? 'true' : undefined}
        aria-describedby={p.error ? `${id}-error` : isNew ? `${id}-new` : undefined}
        data-exercise-input
      />
      {isNew && !p.error && (
        <p id={`${id}-new`} className="text-sm text-ink-soft" data-new-exercise>
          New to the exercise library: it is added when you save the plan.
        </p>
      )}
      <FieldError id={`${id}-error`} message={p.error} />
    </div>
  );
}

import { useEffect, useId, useState } from 'react';
import type { PlanInput } from '~/lib/plan/plan-schema';
import { ApiError } from '../api-client';
import { loadClassPlan, loadTemplateSources, saveTemplate, type TemplateSources } from './plan-api';
import { FieldError, inputClass, smallButton } from './fields';

/**
 * Start or extend the plan from a template (built-in formats, the studio's own) or from an
 * earlier class of the studio; save the current plan as a studio template.
 */
export default function PlanTemplates(p: { lessonId: string; current: PlanInput | null; onReplace(plan: PlanInput): void; onAppend(plan: PlanInput): void }) {
  const [sources, setSources] = useState<TemplateSources | null>(null);
  const [choice, setChoice] = useState('');
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const selectId = useId();
  useEffect(() => {
    loadTemplateSources(p.lessonId).then(setSources, (err: unknown) => setMessage(err instanceof Error ? err.message : 'Templates could not load.'));
  }, [p.lessonId]);

  async function chosenPlan(): Promise<PlanInput | null> {
    if (!sources || !choice) return null;
    const [type, id] = choice.split(':') as ['template' | 'class', string];
    if (type === 'template') return sources.templates.find((t) => t.id === id)?.plan ?? null;
    const plan = await loadClassPlan(id);
    if (!plan) setMessage('That class has no plan yet; choose another.');
    return plan;
  }
  async function use(how: 'replace' | 'append') {
    setMessage(null);
    setBusy(true);
    try {
      const plan = await chosenPlan();
      if (plan) (how === 'replace' ? p.onReplace : p.onAppend)(structuredClone(plan));
    } catch (err) {
      setMessage(err instanceof Error ? err.message : 'That plan could not be read.');
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="flex flex-col gap-3 rounded-[10px] border border-stone/70 p-3" data-plan-templates>
      <div className="flex flex-wrap items-end gap-2">
        <div className="flex min-w-[16rem] flex-1 flex-col gap-1">
          <label htmlFor={selectId} className="text-sm font-semibold">Start from a template or copy the plan of another class</label>
          <select id={selectId} className={inputClass} value={choice} onChange={(e) => setChoice(e.target.value)} disabled={!sources}>
            <option value="">Choose…</option>
            <optgroup label="Formats">
              {sources?.templates.filter((t) => t.builtIn).map((t) => <option key={t.id} value={`template:${t.id}`}>{t.name}</option>)}
            </optgroup>
            {sources && sources.templates.some((t) => !t.builtIn) && (
              <optgroup label="This studio's templates">
                {sources.templates.filter((t) => !t.builtIn).map((t) => <option key={t.id} value={`template:${t.id}`}>{t.name}</option>)}
              </optgroup>
            )}
            {sources && sources.classes.length > 0 && (
              <optgroup label="Copy the plan of">
                {sources.classes.map((c) => <option key={c.id} value={`class:${c.id}`}>{c.title}</option>)}
              </optgroup>
            )}
          </select>
        </div>
        <button type="button" className={smallButton} disabled={!choice || busy} onClick={() => void use('replace')}>Replace the plan</button>
        <button type="button" className={smallButton} disabled={!choice || busy} onClick={() => void use('append')}>Add its blocks</button>
      </div>
      {choice.startsWith('template:') && (
        <p className="text-sm text-ink-soft">{sources?.templates.find((t) => `template:${t.id}` === choice)?.description ?? 'A plan saved by this studio.'}</p>
      )}
      {message && <p role="alert" className="text-sm font-semibold text-error">{message}</p>}
      <SaveAsTemplate plan={p.current} onSaved={(t) => setSources((s) => (s ? { ...s, templates: [...s.templates, t] } : s))} />
    </div>
  );
}

function SaveAsTemplate({ plan, onSaved }: { plan: PlanInput | null; onSaved(t: TemplateSources['templates'][number]): void }) {
  const [name, setName] = useState('');
  const [error, setError] = useState<string | undefined>();
  const [saved, setSaved] = useState<string | null>(null);
  const id = useId();
  async function save() {
    setError(undefined);
    setSaved(null);
    try {
      const t = await saveTemplate(name, plan!);
      onSaved(t);
      setSaved(t.name);
      setName('');
    } catch (err) {
      setError(err instanceof ApiError ? (err.fields?.name ?? err.message) : 'Saving did not work. Try again in a moment.');
    }
  }
  return (
    <div className="flex flex-wrap items-end gap-2">
      <div className="flex min-w-[16rem] flex-1 flex-col gap-1">
        <label htmlFor={id} className="text-sm font-semibold">Save this plan as a studio template</label>
        <input id={id} className={inputClass} value={name} onChange={(e) => setName(e.target.value)} placeholder="Template name" aria-invalid={error ? 'true' : undefined} aria-describedby={error ? `${id}-error` : undefined} />
        <FieldError id={`${id}-error`} message={error} />
      </div>
      <button type="button" className={smallButton} disabled={!plan} onClick={() => void save()} title={plan ? undefined : 'Fix the plan first; a template must be a valid plan.'}>
        Save as template
      </button>
      {saved && <p role="status" className="text-sm text-mint-deep">Saved “{saved}” to this studio’s templates.</p>}
    </div>
  );
}

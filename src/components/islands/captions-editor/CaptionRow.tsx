/** One caption as typed in the editor: times as text (m:ss.sss), so a half-typed time is kept. */
export interface CueDraft {
  start: string;
  end: string;
  text: string;
}

interface Props {
  index: number;
  draft: CueDraft;
  /** Field messages from the last save, keyed like the schema's paths (`cues.3.endSeconds`). */
  fields: Record<string, string>;
  disabled: boolean;
  onChange: (next: CueDraft) => void;
  onRemove: () => void;
}

const input = 'rounded-[10px] border border-slate bg-chalk px-2 py-1 tabular';

/** A caption's start, end and text with their own messages, and its Remove button. */
export function CaptionRow({ index, draft, fields, disabled, onChange, onRemove }: Props) {
  const n = index + 1;
  const id = (f: string) => `caption-${n}-${f}`;
  const problems = [fields[`cues.${index}.startSeconds`], fields[`cues.${index}.endSeconds`], fields[`cues.${index}.text`], fields[`cues.${index}`]].filter(Boolean);
  return (
    <li className="rounded-[10px] border border-slate/60 p-2" data-caption={n}>
      <div className="flex flex-wrap items-start gap-2">
        <span className="pt-1 text-sm font-bold tabular" aria-hidden="true">{n}</span>
        <label className="flex flex-col text-xs font-semibold">
          <span>Start</span>
          <input className={`${input} w-24 text-sm`} value={draft.start} disabled={disabled} aria-label={`Caption ${n} start`} aria-invalid={!!fields[`cues.${index}.startSeconds`]} aria-describedby={problems.length ? id('problem') : undefined} onChange={(e) => onChange({ ...draft, start: e.target.value })} />
        </label>
        <label className="flex flex-col text-xs font-semibold">
          <span>End</span>
          <input className={`${input} w-24 text-sm`} value={draft.end} disabled={disabled} aria-label={`Caption ${n} end`} aria-invalid={!!fields[`cues.${index}.endSeconds`]} aria-describedby={problems.length ? id('problem') : undefined} onChange={(e) => onChange({ ...draft, end: e.target.value })} />
        </label>
        <label className="flex min-w-48 flex-1 flex-col text-xs font-semibold">
          <span>Text</span>
          <textarea className={`${input} text-sm font-normal`} rows={2} value={draft.text} disabled={disabled} aria-label={`Caption ${n} text`} aria-invalid={!!fields[`cues.${index}.text`]} aria-describedby={problems.length ? id('problem') : undefined} onChange={(e) => onChange({ ...draft, text: e.target.value })} />
        </label>
        <button type="button" className="mt-4 rounded-[10px] border border-error px-2 py-1 text-sm font-semibold text-error hover:bg-error hover:text-white" disabled={disabled} onClick={onRemove} aria-label={`Remove caption ${n}`}>
          Remove
        </button>
      </div>
      {problems.length > 0 && <p id={id('problem')} className="mt-1 text-sm font-semibold text-error">{problems.join(' ')}</p>}
    </li>
  );
}

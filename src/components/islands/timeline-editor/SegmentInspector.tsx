import { useState, type RefObject } from 'react';
import { CUE_KINDS, type Cue, type CueKind, type Segment, type SegmentKind } from '~/lib/timeline/timeline-schema';
import type { Edge, SegmentDetails, Selection } from '~/lib/editor/editor-state';
import { CUE_KIND_LABELS, KIND_COLOURS, SEGMENT_KIND_LABELS, SEGMENT_KIND_ORDER } from '~/lib/editor/segment-style';
import { formatEditorTime, formatLength } from '~/lib/time/format-time';

export interface SegmentInspectorProps {
  selection: Selection;
  segment: Segment | undefined;
  cue: Cue | undefined;
  exercises: readonly string[];
  /** An AMRAP span: the exercises of the plan's AMRAP block it stands for (undefined when none matches). */
  amrapExercises: readonly string[] | undefined;
  exerciseInputRef: RefObject<HTMLInputElement | null>;
  onKind(kind: SegmentKind): void;
  onExercise(exercise: string): void;
  onDetails(details: SegmentDetails): void;
  onEdge(edge: Edge): void;
  onNudge(delta: number): void;
  onCueKind(kind: CueKind): void;
  onCueText(text: string): void;
  onDelete(): void;
  onSeek(seconds: number): void;
}

const NUDGES = [
  { delta: -1, label: '−1 s', name: '1 second earlier' },
  { delta: -0.1, label: '−0.1 s', name: '0.1 seconds earlier' },
  { delta: 0.1, label: '+0.1 s', name: '0.1 seconds later' },
  { delta: 1, label: '+1 s', name: '1 second later' },
];

const button = 'rounded-[10px] border border-ink/70 px-3 py-1.5 text-sm font-bold hover:bg-ink hover:text-paper aria-pressed:bg-ink aria-pressed:text-paper';

/** Details of what is selected: kind, exercise, edges with nudge buttons (touch-friendly), or a cue. */
export default function SegmentInspector({ exerciseInputRef, ...p }: SegmentInspectorProps) {
  const [exerciseDraft, setExerciseDraft] = useState(p.segment?.exercise ?? '');
  const [cueDraft, setCueDraft] = useState(p.cue?.text ?? '');
  // A new selection or a change from elsewhere (undo, a fix) replaces the draft; adjusted while
  // rendering, as React recommends, instead of in an effect that would render twice.
  const segmentKey = `${p.segment?.id}|${p.segment?.exercise}`;
  const cueKey = `${p.cue?.id}|${p.cue?.text}`;
  const [seen, setSeen] = useState({ segmentKey, cueKey });
  if (seen.segmentKey !== segmentKey || seen.cueKey !== cueKey) {
    setSeen({ segmentKey, cueKey });
    if (seen.segmentKey !== segmentKey) setExerciseDraft(p.segment?.exercise ?? '');
    if (seen.cueKey !== cueKey) setCueDraft(p.cue?.text ?? '');
  }

  if (p.segment && p.selection?.type === 'segment') {
    const s = p.segment;
    const edge = p.selection.edge;
    return (
      <section aria-labelledby="inspector-title" className="rounded-[10px] border border-stone/70 p-4" data-inspector="segment">
        <h3 id="inspector-title" className="flex items-center gap-2 text-lg">
          <span aria-hidden="true" className="inline-block h-4 w-4 rounded-[4px]" style={{ background: KIND_COLOURS[s.kind] }} />
          Selected segment
        </h3>
        <p className="tabular text-sm text-ink-soft" data-selected-times>
          {formatEditorTime(s.startSeconds)} – {formatEditorTime(s.endSeconds)} · {formatLength(s.endSeconds - s.startSeconds)}
          {s.round ? ` · round ${s.round}` : ''}{s.set ? ` · set ${s.set}` : ''}{s.side ? ` · ${s.side} side` : ''}
        </p>
        <div className="mt-3 grid gap-3 sm:grid-cols-2">
          <label className="flex flex-col gap-1 text-sm font-semibold">
            Kind
            <select value={s.kind} onChange={(e) => p.onKind(e.target.value as SegmentKind)} className="rounded-[10px] border border-slate bg-chalk px-3 py-2 font-normal">
              {SEGMENT_KIND_ORDER.map((k, i) => (
                <option key={k} value={k}>{`${SEGMENT_KIND_LABELS[k]} (${i + 1})`}</option>
              ))}
            </select>
          </label>
          <label className="flex flex-col gap-1 text-sm font-semibold">
            Exercise
            <input
              ref={exerciseInputRef}
              list="editor-exercises"
              value={exerciseDraft}
              disabled={s.kind !== 'work' && s.kind !== 'rest'}
              placeholder={s.kind === 'work' || s.kind === 'rest' ? 'e.g. Squat jump' : 'Only for work and rest'}
              onChange={(e) => setExerciseDraft(e.target.value)}
              onBlur={() => p.onExercise(exerciseDraft)}
              onKeyDown={(e) => {
                if (e.key === 'Enter') {
                  p.onExercise(exerciseDraft);
                  (e.target as HTMLInputElement).blur();
                }
                if (e.key === 'Escape') (e.target as HTMLInputElement).blur();
              }}
              className="rounded-[10px] border border-slate bg-chalk px-3 py-2 font-normal disabled:bg-paper"
            />
            <datalist id="editor-exercises">
              {p.exercises.map((x) => <option key={x} value={x} />)}
            </datalist>
          </label>
        </div>
        {s.format === 'amrap' && s.kind === 'work' && <AmrapList exercises={p.amrapExercises} />}
        <SegmentDetailsFields key={`${s.id}|${s.title ?? ''}|${s.round ?? ''}|${s.set ?? ''}|${s.side ?? ''}`} segment={s} onDetails={p.onDetails} />
        <fieldset className="mt-3">
          <legend className="text-sm font-semibold">Boundary to move</legend>
          <div className="mt-1 flex flex-wrap items-center gap-2">
            <button type="button" className={button} aria-pressed={edge === 'start'} onClick={() => p.onEdge('start')}>
              Start <span className="tabular">{formatEditorTime(s.startSeconds)}</span>
            </button>
            <button type="button" className={button} aria-pressed={edge === 'end'} onClick={() => p.onEdge('end')}>
              End <span className="tabular">{formatEditorTime(s.endSeconds)}</span>
            </button>
            <span className="mx-1 h-6 w-px bg-stone" aria-hidden="true" />
            {NUDGES.map((n) => (
              <button key={n.delta} type="button" className={`${button} tabular`} onClick={() => p.onNudge(n.delta)} aria-label={`Move the ${edge ?? 'start'} ${n.name}`}>
                {n.label}
              </button>
            ))}
          </div>
        </fieldset>
        <div className="mt-3 flex flex-wrap gap-2">
          <button type="button" className={button} onClick={() => p.onSeek(s.startSeconds)}>Go to start</button>
          <button type="button" className={`${button} border-error text-error hover:bg-error hover:text-white`} onClick={p.onDelete}>
            {edge ? 'Join with the neighbour' : 'Delete segment'}
          </button>
        </div>
      </section>
    );
  }
  if (p.cue && p.selection?.type === 'cue') {
    const c = p.cue;
    return (
      <section aria-labelledby="inspector-title" className="rounded-[10px] border border-stone/70 p-4" data-inspector="cue">
        <h3 id="inspector-title" className="flex items-center gap-2 text-lg">
          <span aria-hidden="true" className="inline-block h-3.5 w-3.5 rounded-full bg-mint" />
          Selected cue <span className="tabular text-base font-semibold text-ink-soft">at {formatEditorTime(c.atSeconds)}</span>
        </h3>
        <div className="mt-3 grid gap-3 sm:grid-cols-[12rem_1fr]">
          <label className="flex flex-col gap-1 text-sm font-semibold">
            Kind
            <select value={c.kind} onChange={(e) => p.onCueKind(e.target.value as CueKind)} className="rounded-[10px] border border-slate bg-chalk px-3 py-2 font-normal">
              {CUE_KINDS.map((k) => <option key={k} value={k}>{CUE_KIND_LABELS[k]}</option>)}
            </select>
          </label>
          <label className="flex flex-col gap-1 text-sm font-semibold">
            What the coach says or shows
            <input
              value={cueDraft}
              onChange={(e) => setCueDraft(e.target.value)}
              onBlur={() => p.onCueText(cueDraft)}
              onKeyDown={(e) => {
                if (e.key === 'Enter') (e.target as HTMLInputElement).blur();
              }}
              className="rounded-[10px] border border-slate bg-chalk px-3 py-2 font-normal"
            />
          </label>
        </div>
        <div className="mt-3 flex flex-wrap gap-2">
          {NUDGES.map((n) => (
            <button key={n.delta} type="button" className={`${button} tabular`} onClick={() => p.onNudge(n.delta)} aria-label={`Move the cue ${n.name}`}>
              {n.label}
            </button>
          ))}
          <button type="button" className={`${button} border-error text-error hover:bg-error hover:text-white`} onClick={p.onDelete}>Delete cue</button>
        </div>
      </section>
    );
  }
  return (
    <section aria-labelledby="inspector-title" className="rounded-[10px] border border-dashed border-stone p-4" data-inspector="none">
      <h3 id="inspector-title" className="text-lg">Nothing selected</h3>
      <p className="mt-1 text-sm text-ink-soft">
        Click a segment or a cue on the timeline, pick one from the list below, or press ] to jump to the next boundary.
      </p>
    </section>
  );
}

const field = 'rounded-[10px] border border-slate bg-chalk px-3 py-2 font-normal';

/** What members repeat in this AMRAP span; the list is edited in the plan, where it lives. */
function AmrapList({ exercises }: { exercises: readonly string[] | undefined }) {
  if (!exercises) {
    return (
      <p className="mt-3 text-sm text-ink-soft" data-amrap-exercises="none">
        No AMRAP block of the plan matches this span, so members see no list of exercises. Add an AMRAP block to the plan, or change the span’s format.
      </p>
    );
  }
  return (
    <div className="mt-3 rounded-[10px] bg-paper p-3" data-amrap-exercises>
      <p className="text-sm font-semibold">Members repeat, as many rounds as they can (from the plan):</p>
      <ol className="mt-1 list-decimal pl-5 text-sm">
        {exercises.map((name, i) => <li key={i}>{name}</li>)}
      </ol>
    </div>
  );
}

/**
 * Title, round, set and side of the selected segment. Text and numbers are kept as typed and
 * applied on Enter or when the field is left (one undo step each); the side applies at once.
 * A new selection or an undo remounts this (its key), so the drafts always start from the segment.
 */
function SegmentDetailsFields({ segment: s, onDetails }: { segment: Segment; onDetails(details: SegmentDetails): void }) {
  const [title, setTitle] = useState(s.title ?? '');
  const [round, setRound] = useState(s.round?.toString() ?? '');
  const [set, setSet] = useState(s.set?.toString() ?? '');
  const count = (text: string): number | null => (text.trim() === '' ? null : Number(text));
  const commitOnEnter = (e: React.KeyboardEvent<HTMLInputElement>) => {
    if (e.key === 'Enter') (e.target as HTMLInputElement).blur();
  };
  return (
    <div className="mt-3 grid gap-3 sm:grid-cols-4" data-segment-details>
      <label className="flex flex-col gap-1 text-sm font-semibold sm:col-span-2">
        Title
        <input value={title} placeholder="Chapter name (optional)" onChange={(e) => setTitle(e.target.value)} onBlur={() => onDetails({ title })} onKeyDown={commitOnEnter} className={field} />
      </label>
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Round
        <input type="number" min={1} inputMode="numeric" value={round} onChange={(e) => setRound(e.target.value)} onBlur={() => onDetails({ round: count(round) })} onKeyDown={commitOnEnter} className={`${field} tabular`} />
      </label>
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Set
        <input type="number" min={1} inputMode="numeric" value={set} onChange={(e) => setSet(e.target.value)} onBlur={() => onDetails({ set: count(set) })} onKeyDown={commitOnEnter} className={`${field} tabular`} />
      </label>
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Side
        <select value={s.side ?? ''} onChange={(e) => onDetails({ side: e.target.value === '' ? null : (e.target.value as 'left' | 'right') })} className={field}>
          <option value="">Both / not per side</option>
          <option value="left">Left</option>
          <option value="right">Right</option>
        </select>
      </label>
    </div>
  );
}

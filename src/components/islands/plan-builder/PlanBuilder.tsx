import '../zod-without-eval'; // first: before any schema is built
import { useEffect, useId, useMemo, useRef, useState, type ReactNode } from 'react';
import { BLOCK_KIND_LABELS, BLOCK_KINDS, draftBlockSeconds } from '~/lib/plan/plan-editing';
import { formatLength } from '~/lib/time/format-time';
import { loadPlanBuilder, type PlanBuilderData } from './plan-api';
import { usePlanDraft, type PlanDraftApi } from './use-plan-draft';
import BlockEditor from './BlockEditor';
import PlanLengths from './PlanLengths';
import PlanSettings from './PlanSettings';
import PlanTemplates from './PlanTemplates';
import { smallButton } from './fields';

export interface PlanBuilderProps {
  lessonId: string;
  advertisedMinutes: number;
}

type Loaded = { status: 'loading' } | { status: 'error'; message: string } | { status: 'ready'; data: PlanBuilderData };

/** The class page's "Plan" section: build, check the lengths of and save the class plan. */
export default function PlanBuilder({ lessonId, advertisedMinutes }: PlanBuilderProps) {
  const [loaded, setLoaded] = useState<Loaded>({ status: 'loading' });
  useEffect(() => {
    let cancelled = false;
    loadPlanBuilder(lessonId)
      .then((data) => !cancelled && setLoaded({ status: 'ready', data }))
      .catch((err: unknown) => !cancelled && setLoaded({ status: 'error', message: err instanceof Error ? err.message : 'The plan could not load. Reload the page to try again.' }));
    return () => {
      cancelled = true;
    };
  }, [lessonId]);
  if (loaded.status === 'loading') return <p className="text-ink-soft" role="status">Loading the plan…</p>;
  if (loaded.status === 'error') return <p role="alert" className="rounded-[10px] bg-error/10 p-3 font-semibold text-error">{loaded.message}</p>;
  return <Builder lessonId={lessonId} advertisedMinutes={advertisedMinutes} data={loaded.data} />;
}

function Builder({ lessonId, advertisedMinutes, data }: PlanBuilderProps & { data: PlanBuilderData }) {
  const d = usePlanDraft(lessonId, data.plan, data.version);
  const listId = useId();
  const [library, setLibrary] = useState(data.exercises);
  const known = useMemo(() => new Set(library.map((n) => n.toLowerCase())), [library]);
  // Names a save added join the list at once; adjusted while rendering, as React recommends, not in an effect.
  const [seenSave, setSeenSave] = useState(d.saveState);
  if (seenSave !== d.saveState) {
    const s = d.saveState;
    setSeenSave(s);
    if (s.status === 'saved' && s.added.length > 0) setLibrary((l) => [...new Set([...l, ...s.added])].sort());
  }
  const listRef = useRef<HTMLOListElement>(null);
  const [drag, setDrag] = useState<{ from: number; to: number } | null>(null);
  // Pointer dragging (mouse, pen and touch alike): the block under the pointer is where it lands.
  const indexAt = (y: number): number => {
    const items = [...(listRef.current?.children ?? [])];
    const hit = items.findIndex((el) => {
      const r = el.getBoundingClientRect();
      return y >= r.top && y <= r.bottom;
    });
    if (hit >= 0) return hit;
    const first = items[0]?.getBoundingClientRect();
    return first && y < first.top ? 0 : items.length - 1;
  };
  const blockSeconds = d.draft.items.map((it) => draftBlockSeconds(it.block, d.draft.options));
  const total = d.plan ? blockSeconds.reduce<number>((sum, s) => sum + (s ?? 0), 0) : null;

  return (
    <div className="flex flex-col gap-4" data-plan-builder>
      <datalist id={listId}>
        {library.map((n) => <option key={n} value={n} />)}
      </datalist>
      <PlanTemplates lessonId={lessonId} current={d.plan} onReplace={d.replace} onAppend={d.append} />
      <PlanLengths plannedSeconds={total} advertisedMinutes={advertisedMinutes} recordingSeconds={data.recordingSeconds} percent={Number(d.draft.tolerances.advertisedPercent ?? 10)} />
      {d.fields.blocks && <p className="text-sm font-semibold text-error" data-field-error>{d.fields.blocks}</p>}
      <ol ref={listRef} className="flex flex-col gap-3" aria-label="Blocks of the plan">
        {d.draft.items.map((it, i) => (
          <li
            key={it.key}
            className={`rounded-[10px] border bg-chalk p-3 ${drag?.from === i ? 'border-dashed border-ink opacity-60' : drag?.to === i ? 'border-ink shadow-[0_0_0_2px_#172033]' : 'border-stone/70'}`}
            data-plan-block={it.block.kind}
          >
            <BlockHeader
              d={d}
              index={i}
              count={d.draft.items.length}
              seconds={blockSeconds[i] ?? null}
              onDragStart={() => setDrag({ from: i, to: i })}
              onDragMove={(y) => setDrag((g) => (g ? { ...g, to: indexAt(y) } : g))}
              onDragEnd={(commit) => {
                if (commit && drag && drag.from !== drag.to) d.moveBlock(drag.from, drag.to);
                setDrag(null);
              }}
            />
            <div className="mt-3">
              <BlockEditor block={it.block} path={`blocks.${i}`} fields={d.fields} exerciseListId={listId} knownExercises={known} onChange={(b) => d.setBlock(i, b)} />
            </div>
          </li>
        ))}
      </ol>
      <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Add a block">
        <span className="text-sm font-semibold">Add:</span>
        {BLOCK_KINDS.map((k) => (
          <button key={k} type="button" className={smallButton} onClick={() => d.addBlock(k)}>
            + {BLOCK_KIND_LABELS[k]}
          </button>
        ))}
      </div>
      <PlanSettings d={d} />
      <SaveRow d={d} />
    </div>
  );
}

function BlockHeader(props: {
  d: PlanDraftApi;
  index: number;
  count: number;
  seconds: number | null;
  onDragStart(): void;
  onDragMove(clientY: number): void;
  onDragEnd(commit: boolean): void;
}) {
  const { d, index, count, seconds } = props;
  const kind = d.draft.items[index]!.block.kind;
  const name = `${BLOCK_KIND_LABELS[kind]} (block ${index + 1})`;
  return (
    <div
      className="flex flex-wrap items-center gap-2"
      onKeyDown={(e) => {
        // Alt + arrow moves the block, like the buttons (keyboard reordering).
        if (!e.altKey || (e.key !== 'ArrowUp' && e.key !== 'ArrowDown')) return;
        e.preventDefault();
        d.moveBlock(index, index + (e.key === 'ArrowUp' ? -1 : 1));
      }}
    >
      <span
        onPointerDown={(e) => {
          e.preventDefault();
          e.currentTarget.setPointerCapture(e.pointerId);
          props.onDragStart();
        }}
        onPointerMove={(e) => {
          if (e.currentTarget.hasPointerCapture(e.pointerId)) props.onDragMove(e.clientY);
        }}
        onPointerUp={() => props.onDragEnd(true)}
        onPointerCancel={() => props.onDragEnd(false)}
        className="cursor-grab touch-none select-none rounded-[4px] px-1 text-lg text-ink-soft"
        title="Drag to reorder (or use Up and Down)"
        aria-hidden="true"
        data-drag-handle
      >
        ⠿
      </span>
      <h3 className="text-lg font-bold">{BLOCK_KIND_LABELS[kind]}</h3>
      <span className="tabular rounded-full bg-paper px-2 py-0.5 text-sm" data-block-length>{seconds === null ? '—' : formatLength(seconds)}</span>
      <span className="ml-auto flex flex-wrap gap-1">
        <Small onClick={() => d.moveBlock(index, index - 1)} disabled={index === 0} label={`Move ${name} up`} keys="Alt+ArrowUp">↑ Up</Small>
        <Small onClick={() => d.moveBlock(index, index + 1)} disabled={index === count - 1} label={`Move ${name} down`} keys="Alt+ArrowDown">↓ Down</Small>
        <Small onClick={() => d.duplicateBlock(index)} label={`Duplicate ${name}`}>Duplicate</Small>
        <Small onClick={() => d.removeBlock(index)} label={`Remove ${name}`}>Remove</Small>
      </span>
    </div>
  );
}

function Small({ onClick, disabled, label, keys, children }: { onClick(): void; disabled?: boolean; label: string; keys?: string; children: ReactNode }) {
  return (
    <button type="button" className={smallButton} onClick={onClick} disabled={disabled} aria-label={label} aria-keyshortcuts={keys}>
      {children}
    </button>
  );
}

function SaveRow({ d }: { d: PlanDraftApi }) {
  const s = d.saveState;
  return (
    <div className="flex flex-wrap items-center gap-3 rounded-[10px] bg-paper p-3">
      <p className="text-sm font-semibold" role="status" data-plan-save-state={s.status}>
        {s.status === 'saving'
          ? 'Saving…'
          : s.status === 'conflict'
            ? 'Someone else saved this class after you opened it; nothing of yours was saved.'
            : d.dirty
              ? 'Unsaved changes'
              : s.status === 'saved'
                ? `Plan saved${s.added.length ? `; added to the exercise library: ${s.added.join(', ')}` : ''}.`
                : 'Plan saved.'}
      </p>
      {s.status === 'error' && <p role="alert" className="text-sm font-semibold text-error">{s.message}</p>}
      {s.status === 'conflict' && (
        <button type="button" className={smallButton} onClick={() => window.location.reload()}>
          Reload to see their changes
        </button>
      )}
      <button type="button" onClick={() => void d.save()} disabled={s.status === 'saving' || !d.dirty} className="ml-auto rounded-[10px] bg-ink px-4 py-2 font-bold text-paper disabled:opacity-50">
        Save plan
      </button>
    </div>
  );
}

/**
 * The plan being built: blocks (each with a stable key for React and dragging), tolerances and
 * options; the schema's messages per field on every change; saving against the class version.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import { DEFAULT_PLAN_OPTIONS, DEFAULT_TOLERANCES, planSchema, type Plan, type PlanInput } from '~/lib/plan/plan-schema';
import { duplicateItem, emptyPlan, messagesByPath, moveItem, newBlock, removeItem, type BlockKind, type DraftBlock } from '~/lib/plan/plan-editing';
import { announcePlanSaved, onPlanSaved } from '../plan-events';
import { useLatest } from '../use-latest';
import { savePlan } from './plan-api';

export interface DraftItem {
  key: string;
  block: DraftBlock;
}

export interface PlanDraft {
  items: DraftItem[];
  tolerances: NonNullable<PlanInput['tolerances']>;
  options: NonNullable<PlanInput['options']>;
}

export type PlanSaveState =
  | { status: 'idle' }
  | { status: 'saving' }
  | { status: 'saved'; at: Date; added: string[] }
  | { status: 'error'; message: string }
  | { status: 'conflict' };

let counter = 0;
const nextKey = () => `b${++counter}`;

function toDraft(plan: PlanInput): PlanDraft {
  return {
    items: plan.blocks.map((block) => ({ key: nextKey(), block: structuredClone(block) as DraftBlock })),
    tolerances: { ...DEFAULT_TOLERANCES, ...plan.tolerances },
    options: { ...DEFAULT_PLAN_OPTIONS, ...plan.options },
  };
}

export function draftToPlan(d: PlanDraft): PlanInput {
  return { blocks: d.items.map((i) => i.block), tolerances: d.tolerances, options: d.options };
}

export function usePlanDraft(lessonId: string, initial: Plan | null, initialVersion: number) {
  const [draft, setDraft] = useState<PlanDraft>(() => toDraft(initial ?? emptyPlan()));
  const [savedJson, setSavedJson] = useState(() => (initial ? JSON.stringify(draftToPlan(toDraft(initial))) : ''));
  const version = useRef(initialVersion);
  const [saveState, setSaveState] = useState<PlanSaveState>({ status: 'idle' });
  const [serverFields, setServerFields] = useState<Record<string, string>>({});

  const asPlan = useMemo(() => draftToPlan(draft), [draft]);
  const parsed = useMemo(() => planSchema.safeParse(asPlan), [asPlan]);
  const fields = useMemo(() => ({ ...serverFields, ...(parsed.success ? {} : messagesByPath(parsed.error.issues)) }), [parsed, serverFields]);
  const dirty = JSON.stringify(asPlan) !== savedJson;
  const dirtyRef = useLatest(dirty);
  // The editor may change the plan (leaving a station out): follow it unless this form holds
  // unsaved changes, whose save will then meet the 409 and offer a reload.
  useEffect(
    () =>
      onPlanSaved(lessonId, (saved) => {
        if (saved.version === version.current || dirtyRef.current) return;
        version.current = saved.version;
        const next = toDraft(saved.plan);
        setDraft(next);
        setSavedJson(JSON.stringify(draftToPlan(next)));
      }),
    [lessonId, dirtyRef],
  );

  const update = (change: (d: PlanDraft) => PlanDraft) => {
    setServerFields({});
    setDraft((d) => change(d));
  };
  const setItems = (change: (items: DraftItem[]) => DraftItem[]) => update((d) => ({ ...d, items: change(d.items) }));

  const actions = {
    addBlock: (kind: BlockKind) => setItems((items) => [...items, { key: nextKey(), block: newBlock(kind) }]),
    setBlock: (index: number, block: DraftBlock) => setItems((items) => items.map((it, i) => (i === index ? { ...it, block } : it))),
    moveBlock: (from: number, to: number) => setItems((items) => moveItem(items, from, to)),
    duplicateBlock: (index: number) =>
      setItems((items) => duplicateItem(items, index).map((it, i) => (i === index + 1 ? { ...it, key: nextKey() } : it))),
    removeBlock: (index: number) => setItems((items) => removeItem(items, index)),
    setTolerance: (name: keyof PlanDraft['tolerances'], value: number) => update((d) => ({ ...d, tolerances: { ...d.tolerances, [name]: value } })),
    setOption: (name: keyof PlanDraft['options'], value: boolean) => update((d) => ({ ...d, options: { ...d.options, [name]: value } })),
    /** Replaces the whole plan (a template, a copy from another class). */
    replace: (plan: PlanInput) => update(() => toDraft(plan)),
    /** Adds another plan's blocks at the end (its tolerances and options are not taken). */
    append: (plan: PlanInput) => setItems((items) => [...items, ...toDraft(plan).items]),
  };

  async function save() {
    if (!parsed.success) {
      setSaveState({ status: 'error', message: 'Some fields need a change first; each says what at the field.' });
      return;
    }
    setSaveState({ status: 'saving' });
    try {
      const out = await savePlan(lessonId, version.current, asPlan);
      if (out.ok) {
        version.current = out.version;
        setSavedJson(JSON.stringify(asPlan));
        setSaveState({ status: 'saved', at: new Date(), added: out.addedExercises });
        announcePlanSaved({ lessonId, plan: out.plan, version: out.version });
      } else if (out.conflict) {
        setSaveState({ status: 'conflict' });
      } else {
        setServerFields(out.fields);
        setSaveState({ status: 'error', message: out.message });
      }
    } catch (err) {
      setSaveState({ status: 'error', message: err instanceof Error ? err.message : 'Saving did not work. Try again in a moment.' });
    }
  }

  return { draft, fields, valid: parsed.success, plan: parsed.success ? parsed.data : null, dirty, saveState, save, version, ...actions };
}

export type PlanDraftApi = ReturnType<typeof usePlanDraft>;

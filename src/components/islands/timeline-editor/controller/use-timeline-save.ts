/**
 * Saving the timeline against the version it was read at: the save state, the saved copy
 * (to know what is dirty), the local draft, and the 409 choice between mine and theirs.
 */
import { useEffect, useMemo, useRef, useState, type Dispatch } from 'react';
import { timelinePutSchema, type Timeline } from '~/lib/timeline/timeline-schema';
import { canonicalJson, type EditorAction } from '~/lib/editor/editor-state';
import { clearDraft, readDraft, writeDraft, type StoredDraft } from '~/lib/editor/local-draft';
import { loadTimeline, saveTimeline } from '../editor-api';
import { useLatest } from '../../use-latest';
import { formatInstant } from '~/lib/time/date-format';
import { useStudioClock } from '../../studio-clock-context';

export type SaveState =
  | { status: 'idle' }
  | { status: 'saving' }
  | { status: 'saved'; at: Date }
  | { status: 'error'; message: string }
  | { status: 'conflict' };

export interface Conflict {
  theirs: Timeline;
  version: number;
}

export function useTimelineSave(lessonId: string, initial: { version: number; timeline: Timeline }, current: Timeline, dispatch: Dispatch<EditorAction>) {
  const clock = useStudioClock();
  const versionRef = useRef(initial.version);
  const currentRef = useLatest(current);
  const [savedCanon, setSavedCanon] = useState(() => canonicalJson(initial.timeline));
  const [saveState, setSaveState] = useState<SaveState>({ status: 'idle' });
  const [conflict, setConflict] = useState<Conflict | null>(null);
  const [draftOffer, setDraftOffer] = useState<StoredDraft | null>(() => {
    const d = typeof localStorage === 'undefined' ? null : readDraft(localStorage, lessonId);
    return d && canonicalJson(d.timeline) !== canonicalJson(initial.timeline) ? d : null;
  });

  const canon = useMemo(() => canonicalJson(current), [current]);
  const dirty = canon !== savedCanon;

  // The local draft: written a moment after each change while unsaved, cleared once saved.
  useEffect(() => {
    const timer = setTimeout(() => {
      if (dirty) writeDraft(localStorage, lessonId, { baseVersion: versionRef.current, savedAt: new Date().toISOString(), timeline: current });
      else clearDraft(localStorage, lessonId);
    }, 600);
    return () => clearTimeout(timer);
  }, [dirty, current, lessonId]);

  // Leaving with unsaved changes asks first (the draft is kept on this device either way).
  useEffect(() => {
    if (!dirty) return;
    const onBeforeUnload = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = '';
    };
    window.addEventListener('beforeunload', onBeforeUnload);
    return () => window.removeEventListener('beforeunload', onBeforeUnload);
  }, [dirty]);

  async function save(timeline: Timeline = currentRef.current, version = versionRef.current) {
    const valid = timelinePutSchema.safeParse({ version, ...timeline });
    if (!valid.success) {
      setSaveState({ status: 'error', message: valid.error.issues[0]?.message ?? 'Some marks are not valid yet; check them and save again.' });
      return;
    }
    setSaveState({ status: 'saving' });
    try {
      const out = await saveTimeline(lessonId, version, timeline);
      if (out.ok) {
        versionRef.current = out.version;
        setSavedCanon(canonicalJson(timeline));
        clearDraft(localStorage, lessonId);
        setConflict(null);
        setSaveState({ status: 'saved', at: new Date() });
      } else {
        const theirs = await loadTimeline(lessonId);
        setConflict({ theirs: theirs.timeline, version: theirs.version });
        setSaveState({ status: 'conflict' });
      }
    } catch (err) {
      setSaveState({ status: 'error', message: err instanceof Error ? err.message : 'Saving did not work. Try again in a moment.' });
    }
  }

  function takeTheirs() {
    if (!conflict) return;
    dispatch({ type: 'replace', timeline: conflict.theirs, keepHistory: true, notice: 'You now have their marks. Undo brings yours back.' });
    versionRef.current = conflict.version;
    setSavedCanon(canonicalJson(conflict.theirs));
    clearDraft(localStorage, lessonId);
    setConflict(null);
    setSaveState({ status: 'saved', at: new Date() });
  }

  function keepMine() {
    if (conflict) void save(currentRef.current, conflict.version);
  }

  function restoreDraft() {
    if (!draftOffer) return;
    dispatch({ type: 'replace', timeline: draftOffer.timeline, keepHistory: true, notice: 'Your unsaved marks are back. Save when ready.' });
    versionRef.current = draftOffer.baseVersion;
    setDraftOffer(null);
  }

  function discardDraft() {
    clearDraft(localStorage, lessonId);
    setDraftOffer(null);
  }

  const label =
    saveState.status === 'saving'
      ? 'Saving…'
      : saveState.status === 'conflict'
        ? 'Someone else saved first'
        : dirty
          ? 'Unsaved changes (kept on this device)'
          : saveState.status === 'saved'
            ? `All changes saved at ${formatInstant(saveState.at, clock, 'time')}`
            : 'All changes saved';

  return { saveState, label, dirty, conflict, draftOffer, save, takeTheirs, keepMine, restoreDraft, discardDraft };
}

export type TimelineSave = ReturnType<typeof useTimelineSave>;

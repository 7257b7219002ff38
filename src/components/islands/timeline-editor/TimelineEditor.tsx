import { useCallback, useEffect, useMemo, useReducer, useRef, useState } from 'react';
import type { Plan } from '~/lib/plan/plan-schema';
import type { Peaks } from '~/lib/media/peaks';
import { findOnsets } from '~/lib/media/onsets';
import { timelinePutSchema, type Timeline } from '~/lib/timeline/timeline-schema';
import { checkTiming } from '~/lib/timing/timing-check';
import { fixChanges } from '~/lib/timing/apply-fix';
import type { Finding } from '~/lib/timing/finding-types';
import { formatEditorTime } from '~/lib/time/format-time';
import { boundaries, canonicalJson, editorReducer, initialEditorState, segmentAt, type Edge } from '~/lib/editor/editor-state';
import { edgeTargets, planAnchor, plannedBoundaries, snapTime } from '~/lib/editor/snapping';
import { commandForKey, type ShortcutCommand } from '~/lib/editor/shortcuts';
import { SEGMENT_KIND_ORDER, SEGMENT_KIND_LABELS } from '~/lib/editor/segment-style';
import { clearDraft, readDraft, writeDraft, type StoredDraft } from '~/lib/editor/local-draft';
import { diffTimelines } from '~/lib/editor/timeline-diff';
import { loadEditorData, loadPeaks, loadTimeline, saveTimeline, type EditorData } from './editor-api';
import { createPlayheadStore, usePlayheadTenths, usePlaying, type PlayheadStore } from './playhead-store';
import MediaTimeline, { type MediaTimelineHandle } from './MediaTimeline';
import FindingsPanel from './FindingsPanel';
import CheckSummary from './CheckSummary';
import SegmentInspector from './SegmentInspector';
import SegmentList from './SegmentList';
import ShortcutHelp from './ShortcutHelp';
import ConflictDialog from './ConflictDialog';

export interface TimelineEditorProps {
  lessonId: string;
}

type Loaded = { status: 'loading' } | { status: 'error'; message: string } | { status: 'ready'; data: EditorData; peaks: Peaks | null };

/**
 * The class page's timeline editor: watch the recording, mark segments and cues by keyboard or
 * pointer, lay the plan out, see the timing check's findings on every change and fix them, save.
 */
export default function TimelineEditor({ lessonId }: TimelineEditorProps) {
  const [loaded, setLoaded] = useState<Loaded>({ status: 'loading' });
  useEffect(() => {
    let cancelled = false;
    loadEditorData(lessonId)
      .then(async (data) => {
        const peaks = data.recording?.peaksUrl ? await loadPeaks(data.recording.peaksUrl).catch(() => null) : null;
        if (!cancelled) setLoaded({ status: 'ready', data, peaks });
      })
      .catch((err: unknown) => {
        if (!cancelled) setLoaded({ status: 'error', message: err instanceof Error ? err.message : 'The editor could not load. Reload the page to try again.' });
      });
    return () => {
      cancelled = true;
    };
  }, [lessonId]);

  if (loaded.status === 'loading') return <p className="text-ink-soft" role="status">Loading the timeline…</p>;
  if (loaded.status === 'error') return <p role="alert" className="rounded-[10px] bg-error/10 p-3 font-semibold text-error">{loaded.message}</p>;
  return <Editor lessonId={lessonId} data={loaded.data} peaks={loaded.peaks} />;
}

const ZOOM_LEVELS = [0, 2, 5, 10, 20, 50, 100, 200];
const toolButton =
  'inline-flex items-center gap-1 rounded-[10px] border border-ink/70 px-3 py-2 text-sm font-bold hover:bg-ink hover:text-paper disabled:opacity-50 disabled:hover:bg-transparent disabled:hover:text-ink aria-pressed:bg-ink aria-pressed:text-paper';

function PlayheadTime({ store, total }: { store: PlayheadStore; total: number }) {
  const t = usePlayheadTenths(store);
  return (
    <span className="tabular rounded-[10px] bg-ink px-3 py-2 text-sm font-bold text-paper" aria-live="off" data-playhead>
      {formatEditorTime(t)} <span className="font-normal text-stone">/ {formatEditorTime(total)}</span>
    </span>
  );
}

function PlayButton({ store, disabled, onClick }: { store: PlayheadStore; disabled: boolean; onClick(): void }) {
  const playing = usePlaying(store);
  return (
    <button type="button" className={toolButton} onClick={onClick} disabled={disabled} aria-keyshortcuts="Space K" data-play>
      <span aria-hidden="true">{playing ? '❚❚' : '▶'}</span> {playing ? 'Pause' : 'Play'}
    </button>
  );
}

type SaveState =
  | { status: 'idle' }
  | { status: 'saving' }
  | { status: 'saved'; at: Date }
  | { status: 'error'; message: string }
  | { status: 'conflict' };

function Editor({ lessonId, data, peaks }: { lessonId: string; data: EditorData; peaks: Peaks | null }) {
  const plan: Plan | null = data.plan;
  const mediaSeconds = useMemo(() => {
    const fromRecording = data.recording?.durationSeconds;
    if (fromRecording && fromRecording > 0) return fromRecording;
    if (data.lesson.mediaSeconds && data.lesson.mediaSeconds > 0) return data.lesson.mediaSeconds;
    const lastEnd = Math.max(0, ...data.timeline.segments.map((s) => s.endSeconds), ...data.timeline.cues.map((c) => c.atSeconds));
    return lastEnd > 0 ? lastEnd + 60 : data.lesson.advertisedMinutes * 60;
  }, [data]);

  const [state, dispatch] = useReducer(editorReducer, undefined, () => initialEditorState(data.timeline, mediaSeconds));
  const [playhead] = useState(createPlayheadStore);
  const handle = useRef<MediaTimelineHandle>(null);
  const rootRef = useRef<HTMLDivElement>(null);
  const exerciseInput = useRef<HTMLInputElement>(null);
  const versionRef = useRef(data.version);
  const [savedCanon, setSavedCanon] = useState(() => canonicalJson(data.timeline));
  const [saveState, setSaveState] = useState<SaveState>({ status: 'idle' });
  const [conflict, setConflict] = useState<{ theirs: Timeline; version: number } | null>(null);
  const [snapOn, setSnapOn] = useState(true);
  const [zoomIndex, setZoomIndex] = useState(0);
  const [helpOpen, setHelpOpen] = useState(false);
  const [mediaError, setMediaError] = useState<string | null>(null);
  const [ready, setReady] = useState(false);
  const [draftOffer, setDraftOffer] = useState<StoredDraft | null>(() => {
    const d = typeof localStorage === 'undefined' ? null : readDraft(localStorage, lessonId);
    return d && canonicalJson(d.timeline) !== canonicalJson(data.timeline) ? d : null;
  });

  const canon = useMemo(() => canonicalJson(state.timeline), [state.timeline]);
  const dirty = canon !== savedCanon;

  const check = useMemo(
    () => (plan ? checkTiming(plan, state.timeline, { mediaSeconds, advertisedMinutes: data.lesson.advertisedMinutes }) : null),
    [plan, state.timeline, mediaSeconds, data.lesson.advertisedMinutes],
  );
  const onsets = useMemo(() => (peaks ? findOnsets(peaks) : []), [peaks]);
  const planned = useMemo(() => (plan ? plannedBoundaries(plan, planAnchor(plan, state.timeline)) : []), [plan, state.timeline]);
  const exercises = useMemo(() => {
    const names = new Set<string>();
    for (const b of plan?.blocks ?? []) {
      if (b.kind === 'circuit') b.stations.forEach((s) => names.add(s.exercise));
      if (b.kind === 'intervals') names.add(b.exercise);
    }
    for (const s of state.timeline.segments) if (s.exercise) names.add(s.exercise);
    return [...names].sort();
  }, [plan, state.timeline.segments]);

  // The local draft: written a moment after each change while unsaved, cleared once saved.
  useEffect(() => {
    const timer = setTimeout(() => {
      if (dirty) writeDraft(localStorage, lessonId, { baseVersion: versionRef.current, savedAt: new Date().toISOString(), timeline: state.timeline });
      else clearDraft(localStorage, lessonId);
    }, 600);
    return () => clearTimeout(timer);
  }, [dirty, state.timeline, lessonId]);

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

  const snapDistance = () => {
    const spp = handle.current?.secondsPerPixel() ?? 0.05;
    return Math.min(2, Math.max(0.05, spp * 10)); // about 10 pixels on screen
  };
  const snapPoint = (t: number, bypass: boolean) =>
    snapTime(t, { onsets, planned }, { enabled: snapOn, bypass, maxDistance: snapDistance() }).time;

  const onEdgeDragged = useCallback(
    (segmentId: string, edge: Edge, to: number, bypass: boolean) => {
      const targets = edgeTargets(plan, stateRef.current.timeline, segmentId, edge, onsets, planned);
      const snapped = snapTime(to, targets, { enabled: snapOn, bypass, maxDistance: snapDistance() });
      dispatch({ type: 'move-edge', segmentId, edge, to: snapped.time });
    },
    [plan, onsets, planned, snapOn],
  );
  const onCueDragged = useCallback(
    (cueId: string, to: number, bypass: boolean) => dispatch({ type: 'move-cue', cueId, to: snapPoint(to, bypass) }),
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [onsets, planned, snapOn],
  );
  const stateRef = useRef(state);
  stateRef.current = state;

  const seek = (t: number) => handle.current?.seek(t);

  async function save(timeline: Timeline = stateRef.current.timeline, version = versionRef.current) {
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

  function targetSegmentId(): string | undefined {
    const s = stateRef.current;
    if (s.selection?.type === 'segment') return s.selection.id;
    return segmentAt(s.timeline, playhead.get())?.id;
  }

  function run(command: ShortcutCommand, index?: number, bypass = false) {
    const t = playhead.get();
    switch (command) {
      case 'play-pause':
        if (!data.recording) dispatch({ type: 'select', selection: stateRef.current.selection });
        handle.current?.playPause();
        break;
      case 'split':
        dispatch({ type: 'split', at: snapPoint(t, bypass) });
        break;
      case 'kind': {
        const kind = SEGMENT_KIND_ORDER[index ?? 0];
        const id = targetSegmentId();
        if (!kind || !id) break;
        if (stateRef.current.selection?.type !== 'segment') dispatch({ type: 'select', selection: { type: 'segment', id, edge: null } });
        dispatch({ type: 'set-kind', kind, segmentId: id });
        break;
      }
      case 'exercise': {
        const id = targetSegmentId();
        if (!id) break;
        if (stateRef.current.selection?.type !== 'segment') dispatch({ type: 'select', selection: { type: 'segment', id, edge: null } });
        setTimeout(() => exerciseInput.current?.focus(), 0);
        break;
      }
      case 'nudge-small-back':
        dispatch({ type: 'nudge', delta: -0.1 });
        break;
      case 'nudge-small-forward':
        dispatch({ type: 'nudge', delta: 0.1 });
        break;
      case 'nudge-large-back':
        dispatch({ type: 'nudge', delta: -1 });
        break;
      case 'nudge-large-forward':
        dispatch({ type: 'nudge', delta: 1 });
        break;
      case 'previous-boundary':
      case 'next-boundary': {
        const direction = command === 'next-boundary' ? 1 : -1;
        const list = boundaries(stateRef.current.timeline);
        const target = direction > 0 ? list.find((b) => b > t + 0.0005) : [...list].reverse().find((b) => b < t - 0.0005);
        dispatch({ type: 'select-boundary', from: t, direction });
        if (target !== undefined) seek(target);
        break;
      }
      case 'add-cue':
        dispatch({ type: 'add-cue', at: snapPoint(t, bypass) });
        break;
      case 'delete':
        dispatch({ type: 'delete' });
        break;
      case 'undo':
        dispatch({ type: 'undo' });
        break;
      case 'redo':
        dispatch({ type: 'redo' });
        break;
      case 'layout':
        if (plan) dispatch({ type: 'layout-from-plan', plan, at: snapPoint(t, bypass) });
        break;
      case 'toggle-snap':
        setSnapOn((on) => !on);
        break;
      case 'zoom-in':
        setZoomIndex((i) => Math.min(ZOOM_LEVELS.length - 1, i + 1));
        break;
      case 'zoom-out':
        setZoomIndex((i) => Math.max(0, i - 1));
        break;
      case 'save':
        void save();
        break;
      case 'help':
        setHelpOpen((open) => !open);
        break;
    }
  }
  const runRef = useRef(run);
  runRef.current = run;

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const root = rootRef.current;
      const target = e.target as HTMLElement | null;
      if (!root || !target) return;
      if (!(root.contains(target) || target === document.body)) return;
      if (document.querySelector('dialog[open]')) return;
      const hit = commandForKey(e);
      if (!hit) return;
      const typing = target.closest('input, textarea, select, [contenteditable="true"]');
      if (typing && hit.command !== 'save') return;
      if ((e.key === ' ' || e.key === 'Enter') && target.closest('button, summary, a')) return;
      e.preventDefault();
      runRef.current(hit.command, hit.index, e.altKey);
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, []);

  const onShowFinding = useCallback((f: Finding) => {
    seek(f.atSeconds);
    const change = fixChanges(f.fix)[0];
    const id = change?.segmentId ?? f.segmentIds[0];
    if (id) dispatch({ type: 'select', selection: { type: 'segment', id, edge: change ? (change.field === 'startSeconds' ? 'start' : 'end') : null } });
    else if (f.cueIds?.[0]) dispatch({ type: 'select', selection: { type: 'cue', id: f.cueIds[0] } });
  }, []);
  const onApplyFix = useCallback((f: Finding) => dispatch({ type: 'apply-fix', finding: f }), []);
  const onApplyAll = useCallback(() => {
    if (check) dispatch({ type: 'apply-fixes', findings: check.findings });
  }, [check]);
  const onSelect = useCallback((selection: typeof state.selection) => dispatch({ type: 'select', selection }), []);
  const onPickSegment = useCallback((id: string) => {
    const seg = stateRef.current.timeline.segments.find((s) => s.id === id);
    dispatch({ type: 'select', selection: { type: 'segment', id, edge: null } });
    if (seg) seek(seg.startSeconds);
  }, []);
  const onPickCue = useCallback((id: string) => {
    const cue = stateRef.current.timeline.cues.find((c) => c.id === id);
    dispatch({ type: 'select', selection: { type: 'cue', id } });
    if (cue) seek(cue.atSeconds);
  }, []);

  const sel = state.selection;
  const selectedSegment = sel?.type === 'segment' ? state.timeline.segments.find((s) => s.id === sel.id) : undefined;
  const selectedCue = sel?.type === 'cue' ? state.timeline.cues.find((c) => c.id === sel.id) : undefined;

  const noRecordingNote = data.preparing
    ? `The recording is still being prepared${data.preparing.step ? ` (${data.preparing.step}` + (data.preparing.progress ? `, ${Math.round(data.preparing.progress)} %)` : ')') : ''}. You can mark the timeline over the class length now; the video and waveform appear once it is ready.`
    : 'No recording is ready yet. You can mark the timeline over the class length now; the video and waveform appear once a recording is ready.';

  const saveLabel =
    saveState.status === 'saving'
      ? 'Saving…'
      : saveState.status === 'conflict'
        ? 'Someone else saved first'
        : dirty
          ? 'Unsaved changes (kept on this device)'
          : saveState.status === 'saved'
            ? `All changes saved at ${saveState.at.toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' })}`
            : 'All changes saved';

  const toolbar = (
    <div className="flex flex-wrap items-center gap-2" role="toolbar" aria-label="Timeline tools">
      <PlayButton store={playhead} disabled={!data.recording} onClick={() => run('play-pause')} />
      <PlayheadTime store={playhead} total={mediaSeconds} />
      <button type="button" className={toolButton} onClick={() => run('split')} aria-keyshortcuts="S">Split here</button>
      <button type="button" className={toolButton} onClick={() => run('add-cue')} aria-keyshortcuts="C">Add cue</button>
      <button type="button" className={toolButton} onClick={() => run('layout')} disabled={!plan} aria-keyshortcuts="L" title="Places the plan's parts with their planned lengths, starting at the playhead">
        Lay out plan from here
      </button>
      <span className="mx-1 hidden h-6 w-px bg-stone sm:inline-block" aria-hidden="true" />
      <button type="button" className={toolButton} onClick={() => run('undo')} disabled={state.past.length === 0} aria-keyshortcuts="Control+Z">Undo</button>
      <button type="button" className={toolButton} onClick={() => run('redo')} disabled={state.future.length === 0} aria-keyshortcuts="Control+Shift+Z">Redo</button>
      <span className="mx-1 hidden h-6 w-px bg-stone sm:inline-block" aria-hidden="true" />
      <button type="button" className={toolButton} onClick={() => run('zoom-out')} disabled={zoomIndex === 0} aria-label="Zoom out">−</button>
      <span className="tabular text-sm" aria-live="polite">{zoomIndex === 0 ? 'Whole class' : `${ZOOM_LEVELS[zoomIndex]} px/s`}</span>
      <button type="button" className={toolButton} onClick={() => run('zoom-in')} disabled={zoomIndex === ZOOM_LEVELS.length - 1} aria-label="Zoom in">+</button>
      <label className="ml-1 inline-flex items-center gap-2 text-sm font-semibold">
        <input type="checkbox" checked={snapOn} onChange={(e) => setSnapOn(e.target.checked)} className="h-4 w-4 accent-ink" aria-keyshortcuts="N" />
        Snap to sounds and plan
      </label>
      <button type="button" className={toolButton} onClick={() => setHelpOpen((o) => !o)} aria-expanded={helpOpen} aria-keyshortcuts="?">Keyboard help</button>
    </div>
  );

  return (
    <div ref={rootRef} className="flex flex-col gap-4" data-editor data-editor-ready={ready ? 'true' : undefined}>
      <div className="flex flex-wrap items-center gap-3 rounded-[10px] bg-paper p-3">
        <p className="text-sm font-semibold" role="status" data-save-state={saveState.status} data-dirty={dirty ? 'true' : 'false'}>{saveLabel}</p>
        {saveState.status === 'error' && <p role="alert" className="text-sm font-semibold text-error">{saveState.message}</p>}
        <button type="button" onClick={() => void save()} disabled={saveState.status === 'saving' || (!dirty && saveState.status !== 'error')} className="ml-auto rounded-[10px] bg-ink px-4 py-2 font-bold text-paper disabled:opacity-50" aria-keyshortcuts="Control+S">
          Save timeline
        </button>
      </div>
      {draftOffer && (
        <div className="flex flex-wrap items-center gap-3 rounded-[10px] border border-info/40 bg-info/10 p-3" role="region" aria-label="Unsaved draft">
          <p className="text-sm">
            This device kept marks you had not saved ({new Date(draftOffer.savedAt).toLocaleString()}).
            {draftOffer.baseVersion !== data.version && ' Someone has saved since; when you save, you will see what differs.'}
          </p>
          <button
            type="button"
            className={toolButton}
            onClick={() => {
              dispatch({ type: 'replace', timeline: draftOffer.timeline, keepHistory: true, notice: 'Your unsaved marks are back. Save when ready.' });
              versionRef.current = draftOffer.baseVersion;
              setDraftOffer(null);
            }}
          >
            Bring them back
          </button>
          <button
            type="button"
            className={toolButton}
            onClick={() => {
              clearDraft(localStorage, lessonId);
              setDraftOffer(null);
            }}
          >
            Discard them
          </button>
        </div>
      )}
      {mediaError && <p role="alert" className="rounded-[10px] bg-warning/10 p-3 text-sm font-semibold text-warning">{mediaError}</p>}
      <MediaTimeline
        handleRef={handle}
        playlistUrl={data.recording?.playlistUrl ?? null}
        posterUrl={data.recording?.posterUrl ?? null}
        peaks={peaks}
        duration={mediaSeconds}
        timeline={state.timeline}
        selection={state.selection}
        playhead={playhead}
        zoom={ZOOM_LEVELS[zoomIndex] ?? 0}
        onZoomStep={(d) => setZoomIndex((i) => Math.max(0, Math.min(ZOOM_LEVELS.length - 1, i + d)))}
        onSelect={onSelect}
        onEdgeDragged={onEdgeDragged}
        onCueDragged={onCueDragged}
        onReady={() => setReady(true)}
        onMediaError={setMediaError}
        noRecordingNote={noRecordingNote}
        toolbar={toolbar}
        beside={<FindingsPanel result={check} hasPlan={plan !== null} onShow={onShowFinding} onApplyFix={onApplyFix} onApplyAll={onApplyAll} />}
      />
      <p className="sr-only" aria-live="polite" data-notice>{state.notice ?? ''}</p>
      {state.notice && <p className="text-sm text-ink-soft" aria-hidden="true">{state.notice}</p>}
      {helpOpen && <ShortcutHelp onClose={() => setHelpOpen(false)} />}
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <SegmentInspector
          selection={state.selection}
          segment={selectedSegment}
          cue={selectedCue}
          exercises={exercises}
          exerciseInputRef={exerciseInput}
          onKind={(kind) => dispatch({ type: 'set-kind', kind })}
          onExercise={(exercise) => dispatch({ type: 'set-exercise', exercise })}
          onEdge={(edge) => selectedSegment && dispatch({ type: 'select', selection: { type: 'segment', id: selectedSegment.id, edge } })}
          onNudge={(delta) => dispatch({ type: 'nudge', delta })}
          onCueKind={(kind) => selectedCue && dispatch({ type: 'set-cue', cueId: selectedCue.id, kind })}
          onCueText={(text) => selectedCue && dispatch({ type: 'set-cue', cueId: selectedCue.id, text })}
          onDelete={() => dispatch({ type: 'delete' })}
          onSeek={seek}
        />
        <CheckSummary result={check} />
      </div>
      <SegmentList segments={state.timeline.segments} cues={state.timeline.cues} selection={state.selection} onPickSegment={onPickSegment} onPickCue={onPickCue} />
      {conflict && (
        <ConflictDialog
          differences={diffTimelines(state.timeline, conflict.theirs)}
          busy={saveState.status === 'saving'}
          onKeepMine={() => void save(stateRef.current.timeline, conflict.version)}
          onTakeTheirs={takeTheirs}
        />
      )}
      <p className="sr-only">Segment kinds: {SEGMENT_KIND_ORDER.map((k) => SEGMENT_KIND_LABELS[k]).join(', ')}.</p>
    </div>
  );
}

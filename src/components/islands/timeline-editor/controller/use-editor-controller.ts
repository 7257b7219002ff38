/**
 * The timeline editor's controller: the marks (reducer with undo), the timing check run on
 * every change, snapping, saving, and the command runner the keys and the toolbar share.
 * Components only render what it returns.
 */
import { useCallback, useEffect, useMemo, useReducer, useRef, useState } from 'react';
import type { Plan } from '~/lib/plan/plan-schema';
import type { Peaks } from '~/lib/media/peaks';
import { findOnsets } from '~/lib/media/onsets';
import { checkTiming } from '~/lib/timing/timing-check';
import { fixChanges } from '~/lib/timing/apply-fix';
import type { Finding } from '~/lib/timing/finding-types';
import { editorReducer, initialEditorState, type Edge, type Selection } from '~/lib/editor/editor-state';
import { edgeTargets, planAnchor, plannedBoundaries, snapTime } from '~/lib/editor/snapping';
import { moveTargets, snapSegmentStart } from '~/lib/editor/segment-move';
import type { ShortcutCommand } from '~/lib/editor/shortcuts';
import type { EditorData } from '../editor-api';
import { announcePlanSaved, onPlanSaved } from '../../plan-events';
import { savePlan } from '../../plan-builder/plan-api';
import { leaveStationOut } from '~/lib/plan/leave-out';
import { amrapExercisesBySegment } from '~/lib/timing/amrap-exercises';
import { createPlayheadStore } from '../playhead-store';
import type { MediaTimelineHandle } from '../MediaTimeline';
import { runCommand, ZOOM_LEVELS, type CommandArgs, type CommandContext } from './editor-commands';
import { useEditorKeys } from './use-editor-keys';
import { useTimelineSave } from './use-timeline-save';
import { useLatest } from '../../use-latest';
import { useProposal } from './use-proposal';

/** The media length the editor works over: the recording's, else the class's, else the marks'. */
function mediaSecondsOf(data: EditorData): number {
  const fromRecording = data.recording?.durationSeconds;
  if (fromRecording && fromRecording > 0) return fromRecording;
  if (data.lesson.mediaSeconds && data.lesson.mediaSeconds > 0) return data.lesson.mediaSeconds;
  const lastEnd = Math.max(0, ...data.timeline.segments.map((s) => s.endSeconds), ...data.timeline.cues.map((c) => c.atSeconds));
  return lastEnd > 0 ? lastEnd + 60 : data.lesson.advertisedMinutes * 60;
}

/** Exercise names offered while typing: the plan's and those already marked. */
function exerciseNames(plan: Plan | null, segments: readonly { exercise?: string }[]): string[] {
  const names = new Set<string>();
  for (const b of plan?.blocks ?? []) {
    if (b.kind === 'circuit') b.stations.forEach((s) => names.add(s.exercise));
    if (b.kind === 'intervals') names.add(b.exercise);
  }
  for (const s of segments) if (s.exercise) names.add(s.exercise);
  return [...names].sort();
}

export function useEditorController(lessonId: string, data: EditorData, peaks: Peaks | null) {
  // The plan section on the same page may save a new plan while the editor is open.
  const [plan, setPlan] = useState<Plan | null>(data.plan);
  const planVersion = useRef(data.planVersion);
  const [planMessage, setPlanMessage] = useState<string | null>(null);
  useEffect(
    () =>
      onPlanSaved(lessonId, (saved) => {
        setPlan(saved.plan);
        planVersion.current = saved.version;
      }),
    [lessonId],
  );
  const mediaSeconds = useMemo(() => mediaSecondsOf(data), [data]);
  const [state, dispatch] = useReducer(editorReducer, undefined, () => initialEditorState(data.timeline, mediaSeconds));
  const stateRef = useLatest(state);
  // A recording that arrives while the editor is open brings its own length.
  useEffect(() => dispatch({ type: 'set-media-seconds', seconds: mediaSeconds }), [mediaSeconds]);
  const [playhead] = useState(createPlayheadStore);
  const media = useRef<MediaTimelineHandle>(null);
  const rootRef = useRef<HTMLDivElement>(null);
  const exerciseInput = useRef<HTMLInputElement>(null);
  const [snapOn, setSnapOn] = useState(true);
  const [zoomIndex, setZoomIndex] = useState(0);
  const [helpOpen, setHelpOpen] = useState(false);
  const [mediaError, setMediaError] = useState<string | null>(null);
  const [ready, setReady] = useState(false);
  const saving = useTimelineSave(lessonId, data, state.timeline, dispatch);

  const check = useMemo(
    () => (plan ? checkTiming(plan, state.timeline, { mediaSeconds, advertisedMinutes: data.lesson.advertisedMinutes }) : null),
    [plan, state.timeline, mediaSeconds, data.lesson.advertisedMinutes],
  );
  const onsets = useMemo(() => (peaks ? findOnsets(peaks) : []), [peaks]);
  const planned = useMemo(() => (plan ? plannedBoundaries(plan, planAnchor(plan, state.timeline)) : []), [plan, state.timeline]);
  const exercises = useMemo(() => exerciseNames(plan, state.timeline.segments), [plan, state.timeline.segments]);
  // What members repeat in each marked AMRAP span, from the plan (matched as the check matches).
  const amrapExercises = useMemo(() => (plan ? amrapExercisesBySegment(plan, state.timeline.segments) : new Map<string, string[]>()), [plan, state.timeline.segments]);

  // About 10 pixels on screen, whatever the zoom.
  const snapDistance = () => Math.min(2, Math.max(0.05, (media.current?.secondsPerPixel() ?? 0.05) * 10));
  const snapPoint = (t: number, bypass: boolean) => snapTime(t, { onsets, planned }, { enabled: snapOn, bypass, maxDistance: snapDistance() }).time;

  const seek = (t: number) => media.current?.seek(t);
  const proposal = useProposal(lessonId, dispatch, media, playhead);

  const context: CommandContext = {
    state: () => stateRef.current,
    dispatch,
    playhead,
    media,
    plan,
    hasRecording: data.recording !== null,
    snapPoint,
    setSnapOn,
    setZoomIndex,
    setHelpOpen,
    focusExercise: () => setTimeout(() => exerciseInput.current?.focus(), 0),
    save: () => void saving.save(),
    nextUncertain: () => proposal.nextUncertain(),
  };
  const run = (command: ShortcutCommand, args?: CommandArgs) => runCommand(context, command, args);
  const runRef = useLatest(run);
  useEditorKeys(rootRef, runRef);

  const onEdgeDragged = useCallback(
    (segmentId: string, edge: Edge, to: number, bypass: boolean) => {
      const targets = edgeTargets(plan, stateRef.current.timeline, segmentId, edge, onsets, planned);
      const snapped = snapTime(to, targets, { enabled: snapOn, bypass, maxDistance: snapDistance() });
      dispatch({ type: 'move-edge', segmentId, edge, to: snapped.time });
    },
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [plan, onsets, planned, snapOn],
  );
  // A whole segment dropped somewhere: its start or end snaps (whichever is nearer a target), then
  // the reducer clamps the move to the room it has, like an edge drag. One drop, one undo step.
  const onSegmentDragged = useCallback(
    (segmentId: string, start: number, bypass: boolean) => {
      const timeline = stateRef.current.timeline;
      const seg = timeline.segments.find((s) => s.id === segmentId);
      if (!seg) return;
      const targets = moveTargets(timeline, segmentId, onsets, planned);
      const to = snapSegmentStart(start, seg.endSeconds - seg.startSeconds, targets, { enabled: snapOn, bypass, maxDistance: snapDistance() });
      dispatch({ type: 'move-segment', segmentId, to });
    },
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [onsets, planned, snapOn],
  );
  const onCueDragged = useCallback(
    (cueId: string, to: number, bypass: boolean) => dispatch({ type: 'move-cue', cueId, to: snapPoint(to, bypass) }),
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [onsets, planned, snapOn],
  );
  const onShowFinding = useCallback((f: Finding) => {
    seek(f.atSeconds);
    const change = fixChanges(f.fix)[0];
    const id = change?.segmentId ?? f.segmentIds[0];
    if (id) dispatch({ type: 'select', selection: { type: 'segment', id, edge: change ? (change.field === 'startSeconds' ? 'start' : 'end') : null } });
    else if (f.cueIds?.[0]) dispatch({ type: 'select', selection: { type: 'cue', id: f.cueIds[0] } });
  }, []);
  const onApplyFix = useCallback((f: Finding) => dispatch({ type: 'apply-fix', finding: f }), []);
  // A planned interval the recording lacks: mark it at the playhead with its planned length...
  const onMarkHere = useCallback((f: Finding) => {
    const m = f.missing;
    if (!m) return;
    const at = playhead.get();
    dispatch({
      type: 'insert-segment',
      segment: {
        kind: 'work',
        startSeconds: at,
        endSeconds: at + m.seconds,
        ...(m.exercise ? { exercise: m.exercise } : {}),
        ...(m.round !== undefined ? { round: m.round } : {}),
        ...(m.set !== undefined ? { set: m.set } : {}),
        ...(m.side !== undefined ? { side: m.side } : {}),
        ...(m.format !== undefined ? { format: m.format } : {}),
      },
      notice: 'Marked at the playhead with its planned length. Undo takes it back.',
    });
  }, [playhead]);
  // ...or record in the plan that this round skips it, so the check and the chapters follow the video.
  const onLeaveOut = useCallback(async (f: Finding) => {
    const m = f.missing;
    if (!m || !plan || m.round === undefined || m.stationIndex === undefined) return;
    const changed = leaveStationOut(plan, m.blockIndex, m.round, m.stationIndex);
    if (!changed.ok) return setPlanMessage(changed.message);
    setPlanMessage(null);
    try {
      const out = await savePlan(lessonId, planVersion.current, changed.plan);
      if (out.ok) {
        planVersion.current = out.version;
        setPlan(out.plan);
        announcePlanSaved({ lessonId, plan: out.plan, version: out.version });
        setPlanMessage(`The plan now leaves ${m.exercise ?? 'that station'} out of round ${m.round}.`);
      } else if (out.conflict) {
        setPlanMessage('Someone changed this class after you opened it, so the plan was not changed. Reload the page, then try again.');
      } else {
        setPlanMessage(out.message);
      }
    } catch (err) {
      setPlanMessage(err instanceof Error ? err.message : 'The plan could not be changed. Try again in a moment.');
    }
  }, [lessonId, plan]);
  const onApplyAll = useCallback(() => {
    if (check) dispatch({ type: 'apply-fixes', findings: check.findings });
  }, [check]);
  const onSelect = useCallback((selection: Selection) => dispatch({ type: 'select', selection }), []);
  const onPickSegment = useCallback((id: string) => {
    const seg = stateRef.current.timeline.segments.find((s) => s.id === id);
    dispatch({ type: 'select', selection: { type: 'segment', id, edge: null } });
    if (seg) seek(seg.startSeconds);
  }, [stateRef]);
  const onPickCue = useCallback((id: string) => {
    const cue = stateRef.current.timeline.cues.find((c) => c.id === id);
    dispatch({ type: 'select', selection: { type: 'cue', id } });
    if (cue) seek(cue.atSeconds);
  }, [stateRef]);
  const onZoomStep = useCallback((d: 1 | -1) => setZoomIndex((i) => Math.max(0, Math.min(ZOOM_LEVELS.length - 1, i + d))), []);

  const sel = state.selection;
  const selectedSegment = sel?.type === 'segment' ? state.timeline.segments.find((s) => s.id === sel.id) : undefined;
  const selectedCue = sel?.type === 'cue' ? state.timeline.cues.find((c) => c.id === sel.id) : undefined;

  return {
    data,
    plan,
    mediaSeconds,
    state,
    dispatch,
    playhead,
    media,
    rootRef,
    exerciseInput,
    check,
    exercises,
    amrapExercises,
    snapOn,
    setSnapOn,
    zoomIndex,
    helpOpen,
    setHelpOpen,
    mediaError,
    setMediaError,
    ready,
    setReady,
    saving,
    run,
    seek,
    proposal,
    selectedSegment,
    selectedCue,
    planMessage,
    handlers: { onEdgeDragged, onSegmentDragged, onCueDragged, onShowFinding, onApplyFix, onMarkHere, onLeaveOut, onApplyAll, onSelect, onPickSegment, onPickCue, onZoomStep },
  };
}

export type EditorController = ReturnType<typeof useEditorController>;
/** What the layout hands to its parts: the controller without its element refs. */
export type EditorView = Omit<EditorController, 'rootRef' | 'media' | 'exerciseInput'>;

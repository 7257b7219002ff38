import '../zod-without-eval'; // first: before any schema is built
import { useEffect, useMemo, useState } from 'react';
import type { Peaks } from '~/lib/media/peaks';
import { SEGMENT_KIND_ORDER, SEGMENT_KIND_LABELS } from '~/lib/editor/segment-style';
import { diffTimelines } from '~/lib/editor/timeline-diff';
import { loadEditorData, loadPeaks, loadRecordingState, type EditorData } from './editor-api';
import { useEditorController } from './controller/use-editor-controller';
import { ZOOM_LEVELS } from './controller/editor-commands';
import MediaTimeline from './MediaTimeline';
import EditorToolbar from './EditorToolbar';
import InsertSegmentTool from './InsertSegmentTool';
import TimelineFileTools from './TimelineFileTools';
import SaveBar from './SaveBar';
import DraftOffer from './DraftOffer';
import FindingsPanel from './FindingsPanel';
import CheckSummary from './CheckSummary';
import SegmentInspector from './SegmentInspector';
import SegmentList from './SegmentList';
import ShortcutHelp from './ShortcutHelp';
import ConflictDialog from './ConflictDialog';
import { MarkItForMeButton, ProposalLayer, proposalMarkers } from './MarkItForMe';
import type { StudioClock } from '~/lib/time/date-format';
import { StudioClockContext } from '../studio-clock-context';

export interface TimelineEditorProps {
  lessonId: string;
  /** The studio's zone and locale, for the times the editor shows. */
  clock: StudioClock;
}

type Loaded = { status: 'loading' } | { status: 'error'; message: string } | { status: 'ready'; data: EditorData; peaks: Peaks | null };

/**
 * The class page's timeline editor: watch the recording, mark segments and cues by keyboard or
 * pointer, lay the plan out, see the timing check's findings on every change and fix them, save.
 */
export default function TimelineEditor({ lessonId, clock }: TimelineEditorProps) {
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

  // A recording that becomes ready while the editor is open is loaded in place (no reload, the
  // marks stay): poll its state every few seconds until then.
  const waiting = loaded.status === 'ready' && loaded.data.recording === null;
  useEffect(() => {
    if (!waiting) return;
    let stopped = false;
    const timer = setInterval(() => {
      loadRecordingState(lessonId)
        .then(async ({ recording, preparing }) => {
          const peaks = recording?.peaksUrl ? await loadPeaks(recording.peaksUrl).catch(() => null) : null;
          if (stopped) return;
          setLoaded((l) => (l.status === 'ready' ? { ...l, data: { ...l.data, recording, preparing }, peaks: recording ? peaks : l.peaks } : l));
        })
        .catch(() => undefined); // a missed poll is retried by the next one
    }, 4000);
    return () => {
      stopped = true;
      clearInterval(timer);
    };
  }, [waiting, lessonId]);

  if (loaded.status === 'loading') return <p className="text-ink-soft" role="status">Loading the timeline…</p>;
  if (loaded.status === 'error') return <p role="alert" className="rounded-[10px] bg-error/10 p-3 font-semibold text-error">{loaded.message}</p>;
  return (
    <StudioClockContext.Provider value={clock}>
      <Editor lessonId={lessonId} data={loaded.data} peaks={loaded.peaks} />
    </StudioClockContext.Provider>
  );
}

function noRecordingNote(preparing: EditorData['preparing']): string {
  if (!preparing) return 'No recording is ready yet. You can mark the timeline over the class length now; the video and waveform appear once a recording is ready.';
  const step = preparing.step ? ` (${preparing.step}` + (preparing.progress ? `, ${Math.round(preparing.progress)} %)` : ')') : '';
  return `The recording is still being prepared${step}. You can mark the timeline over the class length now; the video and waveform appear once it is ready.`;
}

/** Lays out the editor's parts; all behaviour lives in the controller. */
function Editor({ lessonId, data, peaks }: { lessonId: string; data: EditorData; peaks: Peaks | null }) {
  // The refs are taken out first: React's checks treat an object that carries refs as a ref itself.
  const { rootRef, media, exerciseInput, ...c } = useEditorController(lessonId, data, peaks);
  const { state, dispatch, handlers: h, saving, selectedSegment, selectedCue } = c;
  const proposalState = c.proposal.state;
  const markers = useMemo(() => proposalMarkers(proposalState), [proposalState]);
  return (
    <div ref={rootRef} className="flex flex-col gap-4" data-editor data-editor-ready={c.ready ? 'true' : undefined}>
      <SaveBar saving={saving} />
      <DraftOffer saving={saving} serverVersion={data.version} />
      {c.mediaError && <p role="alert" className="rounded-[10px] bg-warning/5 p-3 text-sm font-semibold text-warning">{c.mediaError}</p>}
      <MediaTimeline
        handleRef={media}
        playlistUrl={data.recording?.playlistUrl ?? null}
        posterUrl={data.recording?.posterUrl ?? null}
        peaks={peaks}
        duration={c.mediaSeconds}
        timeline={state.timeline}
        selection={state.selection}
        playhead={c.playhead}
        zoom={ZOOM_LEVELS[c.zoomIndex] ?? 0}
        onZoomStep={h.onZoomStep}
        onSelect={h.onSelect}
        onEdgeDragged={h.onEdgeDragged}
        onSegmentDragged={h.onSegmentDragged}
        onCueDragged={h.onCueDragged}
        onReady={() => c.setReady(true)}
        onMediaError={c.setMediaError}
        proposal={markers}
        onProposalPicked={c.proposal.review}
        noRecordingNote={noRecordingNote(data.preparing)}
        toolbar={<EditorToolbar c={c} extra={<><InsertSegmentTool c={c} /><MarkItForMeButton c={c} /></>} />}
        beside={<FindingsPanel result={c.check} hasPlan={c.plan !== null} onShow={h.onShowFinding} onApplyFix={h.onApplyFix} onMarkHere={h.onMarkHere} onLeaveOut={(f) => void h.onLeaveOut(f)} onApplyAll={h.onApplyAll} />}
      />
      <TimelineFileTools c={c} fileName={`timeline-${data.lesson.title.replace(/[^\p{L}\p{N}]+/gu, '-').toLowerCase()}`} />
      {c.planMessage && <p role="status" className="rounded-[10px] bg-info/10 p-3 text-sm font-semibold" data-plan-message>{c.planMessage}</p>}
      <ProposalLayer c={c} />
      <p className="sr-only" aria-live="polite" data-notice>{state.notice ?? ''}</p>
      {state.notice && <p className="text-sm text-ink-soft" aria-hidden="true">{state.notice}</p>}
      {c.helpOpen && <ShortcutHelp onClose={() => c.setHelpOpen(false)} />}
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <SegmentInspector
          selection={state.selection}
          segment={selectedSegment}
          cue={selectedCue}
          exercises={c.exercises}
          amrapExercises={selectedSegment ? c.amrapExercises.get(selectedSegment.id) : undefined}
          exerciseInputRef={exerciseInput}
          onKind={(kind) => dispatch({ type: 'set-kind', kind })}
          onExercise={(exercise) => dispatch({ type: 'set-exercise', exercise })}
          onDetails={(details) => dispatch({ type: 'set-details', details })}
          onEdge={(edge) => selectedSegment && dispatch({ type: 'select', selection: { type: 'segment', id: selectedSegment.id, edge } })}
          onNudge={(delta) => dispatch({ type: 'nudge', delta })}
          onCueKind={(kind) => selectedCue && dispatch({ type: 'set-cue', cueId: selectedCue.id, kind })}
          onCueText={(text) => selectedCue && dispatch({ type: 'set-cue', cueId: selectedCue.id, text })}
          onDelete={() => dispatch({ type: 'delete' })}
          onSeek={c.seek}
        />
        <CheckSummary result={c.check} />
      </div>
      <SegmentList segments={state.timeline.segments} cues={state.timeline.cues} selection={state.selection} onPickSegment={h.onPickSegment} onPickCue={h.onPickCue} />
      {saving.conflict && (
        <ConflictDialog
          differences={diffTimelines(state.timeline, saving.conflict.theirs)}
          busy={saving.saveState.status === 'saving'}
          onKeepMine={saving.keepMine}
          onTakeTheirs={saving.takeTheirs}
        />
      )}
      <p className="sr-only">Segment kinds: {SEGMENT_KIND_ORDER.map((k) => SEGMENT_KIND_LABELS[k]).join(', ')}.</p>
    </div>
  );
}

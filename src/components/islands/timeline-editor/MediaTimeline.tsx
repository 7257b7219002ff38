import { useImperativeHandle, useRef, type ReactNode, type Ref } from 'react';
import type { Peaks } from '~/lib/media/peaks';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import type { Edge, Selection } from '~/lib/editor/editor-state';
import type { PlayheadStore } from './playhead-store';
import { useAltHeld } from './media/use-alt-held';
import { useWheelZoom } from './media/use-wheel-zoom';
import { useMediaWaveform } from './media/use-media-waveform';
import type { ProposalMarkers } from './media/proposal-markers';
import { useLatest } from '../use-latest';

export interface MediaTimelineHandle {
  playPause(): void;
  seek(seconds: number): void;
  /** Seconds per pixel at the current zoom (for snapping distances). */
  secondsPerPixel(): number;
}

export interface MediaTimelineProps {
  handleRef: Ref<MediaTimelineHandle>;
  playlistUrl: string | null;
  posterUrl: string | null;
  peaks: Peaks | null;
  duration: number;
  timeline: Timeline;
  selection: Selection;
  playhead: PlayheadStore;
  /** Pixels per second; 0 fits the whole recording. */
  zoom: number;
  onZoomStep(direction: 1 | -1): void;
  onSelect(selection: Selection): void;
  onEdgeDragged(segmentId: string, edge: Edge, to: number, bypassSnap: boolean): void;
  onSegmentDragged(segmentId: string, start: number, bypassSnap: boolean): void;
  onCueDragged(cueId: string, to: number, bypassSnap: boolean): void;
  onReady(): void;
  onMediaError(message: string): void;
  /** An open "Mark it for me" proposal: its boundaries are drawn inside the waveform. */
  proposal: ProposalMarkers | null;
  onProposalPicked(index: number): void;
  /** Shown beside the video (the findings), and between video and waveform (the toolbar). */
  beside?: ReactNode;
  toolbar?: ReactNode;
  /** What to say in place of the video when there is no ready recording. */
  noRecordingNote: string;
}

/**
 * The recording (hls.js, or native HLS) with the waveform under it. Segments are regions with
 * their kind's colour, pattern and label; cues are pins (see media/).
 */
export default function MediaTimeline(props: MediaTimelineProps) {
  const videoRef = useRef<HTMLVideoElement>(null);
  const waveRef = useRef<HTMLDivElement>(null);
  const rulerRef = useRef<HTMLDivElement>(null);
  const groupRef = useRef<HTMLDivElement>(null);
  const altHeld = useAltHeld();
  const wsRef = useMediaWaveform(props, { video: videoRef, wave: waveRef, ruler: rulerRef }, altHeld);
  const zoomStep = useLatest(props.onZoomStep);
  useWheelZoom(groupRef, zoomStep);

  useImperativeHandle(props.handleRef, () => ({
    playPause() {
      const ws = wsRef.current;
      if (ws && props.playlistUrl) void ws.playPause();
    },
    seek(seconds) {
      const t = Math.max(0, Math.min(props.duration, seconds));
      wsRef.current?.setTime(t);
      props.playhead.set(t);
    },
    secondsPerPixel() {
      const ws = wsRef.current;
      if (!ws) return 0.05;
      const width = ws.getWrapper().scrollWidth || ws.getWidth();
      return width > 0 ? props.duration / width : 0.05;
    },
  }), [props.duration, props.playhead, props.playlistUrl, wsRef]);

  return (
    <div className="flex flex-col gap-3">
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        {props.playlistUrl ? (
          <video
            ref={videoRef}
            className="w-full aspect-video rounded-[10px] bg-ink"
            poster={props.posterUrl ?? undefined}
            playsInline
            preload="metadata"
            aria-label="Class recording"
            data-editor-video
            onClick={() => void wsRef.current?.playPause()}
          />
        ) : (
          <div className="flex aspect-video w-full items-center justify-center rounded-[10px] bg-ink/90 p-6 text-center text-paper" data-no-recording>
            <p>{props.noRecordingNote}</p>
          </div>
        )}
        {props.beside}
      </div>
      {props.toolbar}
      <div
        ref={groupRef}
        className="rounded-[10px] border border-stone/70 bg-chalk p-2"
        role="group"
        tabIndex={0}
        aria-label="Timeline: waveform with segments and cues. Click to move the playhead; drag an edge or a cue to move it, or the middle of a segment to move the whole segment; Ctrl and the mouse wheel zoom."
        data-timeline
      >
        <div ref={waveRef} data-waveform />
        <div ref={rulerRef} aria-hidden="true" />
      </div>
    </div>
  );
}

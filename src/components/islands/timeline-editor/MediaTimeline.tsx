import { useEffect, useImperativeHandle, useRef, type ReactNode, type Ref } from 'react';
import Hls from 'hls.js';
import WaveSurfer from 'wavesurfer.js';
import RegionsPlugin, { type Region } from 'wavesurfer.js/dist/plugins/regions.esm.js';
import TimelinePlugin from 'wavesurfer.js/dist/plugins/timeline.esm.js';
import type { Peaks } from '~/lib/media/peaks';
import type { Segment, Timeline } from '~/lib/timeline/timeline-schema';
import type { Edge, Selection } from '~/lib/editor/editor-state';
import { KIND_COLOURS, SEGMENT_KIND_PATTERNS, SEGMENT_KIND_TAGS, withAlpha } from '~/lib/editor/segment-style';
import { formatClock } from '~/lib/time/format-time';
import type { PlayheadStore } from './playhead-store';

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
  onCueDragged(cueId: string, to: number, bypassSnap: boolean): void;
  onReady(): void;
  onMediaError(message: string): void;
  /** Shown beside the video (the findings), and between video and waveform (the toolbar). */
  beside?: ReactNode;
  toolbar?: ReactNode;
  /** What to say in place of the video when there is no ready recording. */
  noRecordingNote: string;
}

const CUE_PREFIX = 'cue:';
const MINT = '#3BB273';

/** One mono envelope (the louder of min and max per bin), which is all the waveform draws. */
function envelope(peaks: Peaks): Float32Array {
  const out = new Float32Array(peaks.min.length);
  for (let i = 0; i < out.length; i++) out[i] = Math.max(Math.abs(peaks.min[i] as number), Math.abs(peaks.max[i] as number));
  return out;
}

function segmentLabel(s: Segment): string {
  return SEGMENT_KIND_TAGS[s.kind] + (s.exercise ? ` · ${s.exercise}` : '') + (s.round ? ` · R${s.round}` : '') + (s.set ? ` · set ${s.set}` : '');
}

function labelElement(text: string): HTMLElement {
  const el = document.createElement('span');
  el.textContent = text;
  Object.assign(el.style, {
    display: 'inline-block',
    margin: '3px',
    padding: '0 4px',
    font: '700 11px/16px "Nunito Sans", ui-sans-serif, sans-serif',
    color: '#172033',
    background: 'rgba(255,255,255,0.88)',
    borderRadius: '3px',
    whiteSpace: 'nowrap',
    overflow: 'hidden',
    textOverflow: 'ellipsis',
    maxWidth: 'calc(100% - 6px)',
    pointerEvents: 'none',
  });
  return el;
}

function pinElement(): HTMLElement {
  // A round head on the marker's thin stem (design brief: cue pins).
  const el = document.createElement('span');
  Object.assign(el.style, {
    position: 'absolute',
    bottom: '2px',
    left: '-6px',
    width: '12px',
    height: '12px',
    borderRadius: '50%',
    background: MINT,
    border: '2px solid #fff',
    boxShadow: '0 0 0 1px #23774c',
    pointerEvents: 'none',
  });
  return el;
}

function styleSegmentElement(region: Region, s: Segment) {
  const el = region.element;
  if (!el) return;
  const pattern = SEGMENT_KIND_PATTERNS[s.kind];
  el.style.backgroundImage = pattern.image;
  el.style.backgroundSize = pattern.size;
  el.style.borderRadius = '4px';
  el.style.boxSizing = 'border-box';
  // Spans sit in the lower part so the waveform stays readable above them.
  el.style.top = '22px';
  el.style.height = 'calc(100% - 22px)';
  el.title = segmentLabel(s);
}

/**
 * The recording (hls.js, or native HLS) with the waveform under it: wavesurfer.js fed the
 * stored peaks and the <video> as its media, so nothing is downloaded or decoded twice.
 * Segments are regions with their kind's colour, pattern and label; cues are pins.
 */
export default function MediaTimeline(props: MediaTimelineProps) {
  const videoRef = useRef<HTMLVideoElement>(null);
  const waveRef = useRef<HTMLDivElement>(null);
  const rulerRef = useRef<HTMLDivElement>(null);
  const wsRef = useRef<WaveSurfer | null>(null);
  const regionsRef = useRef<ReturnType<typeof RegionsPlugin.create> | null>(null);
  const byId = useRef(new Map<string, { region: Region; key: string }>());
  const propsRef = useRef(props);
  propsRef.current = props;
  const altHeld = useRef(false);
  const readyRef = useRef(false);
  const selectedRef = useRef<string | null>(null);

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
  }), [props.duration, props.playhead, props.playlistUrl]);

  // Alt (Option) held means "place freely", for drags as well as keys.
  useEffect(() => {
    const track = (e: KeyboardEvent | PointerEvent) => {
      altHeld.current = e.altKey;
    };
    window.addEventListener('keydown', track);
    window.addEventListener('keyup', track);
    window.addEventListener('pointerdown', track, true);
    window.addEventListener('pointermove', track, true);
    return () => {
      window.removeEventListener('keydown', track);
      window.removeEventListener('keyup', track);
      window.removeEventListener('pointerdown', track, true);
      window.removeEventListener('pointermove', track, true);
    };
  }, []);

  useEffect(() => {
    let cancelled = false;
    let hls: Hls | null = null;
    let ws: WaveSurfer | null = null;
    const video = videoRef.current;
    const { playlistUrl, peaks, duration, playhead } = propsRef.current;

    const attachHls = (): Promise<void> =>
      new Promise((resolve) => {
        if (!playlistUrl || !video) return resolve();
        if (Hls.isSupported()) {
          hls = new Hls({ maxBufferLength: 20 });
          hls.on(Hls.Events.ERROR, (_e, data) => {
            if (data.fatal) propsRef.current.onMediaError('The recording could not be played here. Reload the page; if it keeps happening, the waveform and marks still work.');
          });
          hls.once(Hls.Events.MEDIA_ATTACHED, () => {
            hls?.loadSource(playlistUrl);
            resolve();
          });
          hls.attachMedia(video);
        } else {
          if (video.canPlayType('application/vnd.apple.mpegurl')) video.src = playlistUrl;
          resolve();
        }
      });

    void attachHls().then(() => {
      if (cancelled || !waveRef.current) return;
      const regions = RegionsPlugin.create();
      regionsRef.current = regions;
      const data = peaks ? envelope(peaks) : new Float32Array(Math.max(1, Math.ceil(duration * 10)));
      ws = WaveSurfer.create({
        container: waveRef.current,
        height: 128,
        waveColor: '#8A94A6',
        progressColor: '#4A5468',
        cursorColor: '#172033',
        cursorWidth: 2,
        media: playlistUrl && video ? video : undefined,
        peaks: [data],
        duration,
        normalize: true,
        autoScroll: true,
        autoCenter: true,
        dragToSeek: false,
        plugins: [
          regions,
          TimelinePlugin.create({
            container: rulerRef.current ?? undefined,
            height: 22,
            formatTimeCallback: (s: number) => formatClock(s),
            secondaryLabelOpacity: 0.6,
            style: { color: '#4A5468', fontSize: '11px' },
          }),
        ],
      });
      wsRef.current = ws;
      ws.on('timeupdate', (t) => playhead.set(t));
      ws.on('interaction', (t) => playhead.set(t));
      ws.on('play', () => playhead.setPlaying(true));
      ws.on('pause', () => playhead.setPlaying(false));
      ws.on('finish', () => playhead.setPlaying(false));
      ws.once('ready', () => {
        readyRef.current = true;
        syncRegions();
        applyZoom();
        propsRef.current.onReady();
      });
      regions.on('region-updated', (region, side) => {
        const p = propsRef.current;
        if (region.id.startsWith(CUE_PREFIX)) p.onCueDragged(region.id.slice(CUE_PREFIX.length), region.start, altHeld.current);
        else if (side) p.onEdgeDragged(region.id, side, side === 'start' ? region.start : region.end, altHeld.current);
        // The state decides where the edge ends up (snapped, clamped); put the region back in line.
        setTimeout(() => syncRegions(true), 0);
      });
      regions.on('region-clicked', (region, e) => {
        e.stopPropagation();
        const p = propsRef.current;
        if (region.id.startsWith(CUE_PREFIX)) p.onSelect({ type: 'cue', id: region.id.slice(CUE_PREFIX.length) });
        else {
          // A click near an edge selects that boundary; elsewhere the segment (and its start).
          const el = region.element;
          let edge: Edge | null = null;
          if (el) {
            const rect = el.getBoundingClientRect();
            if (e.clientX - rect.left < 10) edge = 'start';
            else if (rect.right - e.clientX < 10) edge = 'end';
          }
          p.onSelect({ type: 'segment', id: region.id, edge });
        }
      });
    });

    return () => {
      cancelled = true;
      readyRef.current = false;
      byId.current.clear();
      ws?.destroy();
      hls?.destroy();
      wsRef.current = null;
      regionsRef.current = null;
    };
    // The media and waveform are rebuilt only when the recording itself changes.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [props.playlistUrl, props.peaks, props.duration]);

  /** Brings the regions in line with the timeline: adds, updates and removes by id. */
  function syncRegions(force = false) {
    const regions = regionsRef.current;
    if (!regions || !readyRef.current) return;
    const { timeline } = propsRef.current;
    const seen = new Set<string>();
    for (const s of timeline.segments) {
      seen.add(s.id);
      const key = `${s.kind}|${s.exercise ?? ''}|${s.round ?? ''}|${s.set ?? ''}`;
      const entry = byId.current.get(s.id);
      if (!entry) {
        const region = regions.addRegion({
          id: s.id,
          start: s.startSeconds,
          end: s.endSeconds,
          color: withAlpha(KIND_COLOURS[s.kind], 0.5),
          drag: false,
          resize: true,
          minLength: 0.1,
          content: labelElement(segmentLabel(s)),
        });
        styleSegmentElement(region, s);
        byId.current.set(s.id, { region, key });
        continue;
      }
      const { region } = entry;
      if (entry.key !== key) {
        region.setOptions({ color: withAlpha(KIND_COLOURS[s.kind], 0.5), content: labelElement(segmentLabel(s)) });
        styleSegmentElement(region, s);
        entry.key = key;
      }
      if (force || region.start !== s.startSeconds || region.end !== s.endSeconds) {
        region.setOptions({ start: s.startSeconds, end: s.endSeconds });
      }
    }
    for (const c of timeline.cues) {
      const id = CUE_PREFIX + c.id;
      seen.add(id);
      const entry = byId.current.get(id);
      if (!entry) {
        const region = regions.addRegion({ id, start: c.atSeconds, color: MINT, drag: true, resize: false, content: pinElement() });
        if (region.element) {
          region.element.title = `${c.kind} cue: ${c.text}`;
          region.element.style.borderLeft = `2px solid ${MINT}`;
        }
        byId.current.set(id, { region, key: c.text });
      } else if (force || entry.region.start !== c.atSeconds) {
        entry.region.setOptions({ start: c.atSeconds });
        if (entry.region.element) entry.region.element.title = `${c.kind} cue: ${c.text}`;
      }
    }
    for (const [id, entry] of byId.current) {
      if (!seen.has(id)) {
        entry.region.remove();
        byId.current.delete(id);
      }
    }
    showSelection();
  }

  function showSelection() {
    const { selection } = propsRef.current;
    const id = selection ? (selection.type === 'cue' ? CUE_PREFIX + selection.id : selection.id) : null;
    const previous = selectedRef.current ? byId.current.get(selectedRef.current)?.region.element : null;
    if (previous) {
      previous.style.outline = '';
      previous.style.boxShadow = '';
      previous.style.zIndex = '';
    }
    selectedRef.current = id;
    const el = id ? byId.current.get(id)?.region.element : null;
    if (!el || !selection) return;
    el.style.outline = '2px solid #172033';
    el.style.outlineOffset = '-1px';
    el.style.zIndex = '3';
    if (selection.type === 'segment' && selection.edge) {
      // The selected boundary gets a thick bar on its side.
      el.style.boxShadow = selection.edge === 'start' ? 'inset 5px 0 0 #172033' : 'inset -5px 0 0 #172033';
    }
  }

  function applyZoom() {
    const ws = wsRef.current;
    if (!ws || !readyRef.current) return;
    const { zoom, duration } = propsRef.current;
    const fit = (waveRef.current?.clientWidth ?? 800) / Math.max(1, duration);
    ws.zoom(zoom > 0 ? Math.max(zoom, fit) : fit);
  }

  useEffect(() => syncRegions(), [props.timeline]);
  useEffect(() => showSelection(), [props.selection]);
  useEffect(() => applyZoom(), [props.zoom]);

  // Ctrl/⌘ + wheel zooms; a non-passive listener so the page does not zoom instead.
  const groupRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = groupRef.current;
    if (!el) return;
    const onWheel = (e: WheelEvent) => {
      if (!(e.ctrlKey || e.metaKey)) return;
      e.preventDefault();
      propsRef.current.onZoomStep(e.deltaY < 0 ? 1 : -1);
    };
    el.addEventListener('wheel', onWheel, { passive: false });
    return () => el.removeEventListener('wheel', onWheel);
  }, []);

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
        aria-label="Timeline: waveform with segments and cues. Click to move the playhead; drag an edge or a cue to move it; Ctrl and the mouse wheel zoom."
        data-timeline
      >
        <div ref={waveRef} data-waveform />
        <div ref={rulerRef} aria-hidden="true" />
      </div>
    </div>
  );
}

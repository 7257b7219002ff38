/**
 * The recording and its waveform: wavesurfer.js fed the stored peaks and the <video> as its
 * media, so nothing is downloaded or decoded twice. Rebuilt only when the recording changes;
 * regions follow the timeline through a RegionSync.
 */
import { useCallback, useEffect, useRef, useState, type RefObject } from 'react';
import WaveSurfer from 'wavesurfer.js';
import RegionsPlugin from 'wavesurfer.js/dist/plugins/regions.esm.js';
import TimelinePlugin from 'wavesurfer.js/dist/plugins/timeline.esm.js';
import type { Peaks } from '~/lib/media/peaks';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import type { Edge, Selection } from '~/lib/editor/editor-state';
import { formatClock } from '~/lib/time/format-time';
import type { PlayheadStore } from '../playhead-store';
import { attachHls } from './attach-hls';
import { CUE_PREFIX, envelope } from './region-elements';
import { createRegionSync } from './region-sync';
import { createProposalMarkers, PROPOSAL_PREFIX, type ProposalMarkers } from './proposal-markers';
import { useLatest } from '../../use-latest';

/** What the waveform reads on every event (kept in a ref so handlers see the latest). */
export interface WaveformInputs {
  playlistUrl: string | null;
  peaks: Peaks | null;
  duration: number;
  timeline: Timeline;
  selection: Selection;
  zoom: number;
  playhead: PlayheadStore;
  onSelect(selection: Selection): void;
  onEdgeDragged(segmentId: string, edge: Edge, to: number, bypassSnap: boolean): void;
  /** A whole segment was dragged (both edges): it was dropped starting at `start`. */
  onSegmentDragged(segmentId: string, start: number, bypassSnap: boolean): void;
  onCueDragged(cueId: string, to: number, bypassSnap: boolean): void;
  onReady(): void;
  onMediaError(message: string): void;
  /** An open "Mark it for me" proposal, drawn as markers inside the waveform. */
  proposal: ProposalMarkers | null;
  onProposalPicked(index: number): void;
}

interface Elements {
  video: RefObject<HTMLVideoElement | null>;
  wave: RefObject<HTMLDivElement | null>;
  ruler: RefObject<HTMLDivElement | null>;
}

export function useMediaWaveform(inputs: WaveformInputs, elements: Elements, altHeld: RefObject<boolean>) {
  const inputsRef = useLatest(inputs);
  const wsRef = useRef<WaveSurfer | null>(null);
  const regionsRef = useRef<ReturnType<typeof RegionsPlugin.create> | null>(null);
  const readyRef = useRef(false);
  const [regionSync] = useState(createRegionSync);
  const [proposalMarkers] = useState(createProposalMarkers);

  // Both read only refs, so they stay the same function for the waveform's whole life.
  const syncRegions = useCallback(
    (force = false) => {
      const regions = regionsRef.current;
      if (!regions || !readyRef.current) return;
      regionSync.sync(regions, inputsRef.current.timeline, inputsRef.current.selection, force);
    },
    [regionSync, inputsRef],
  );

  const syncProposal = useCallback(() => {
    const regions = regionsRef.current;
    if (regions && readyRef.current) proposalMarkers.sync(regions, inputsRef.current.proposal);
  }, [proposalMarkers, inputsRef]);

  const wave = elements.wave;
  const applyZoom = useCallback(() => {
    const ws = wsRef.current;
    if (!ws || !readyRef.current) return;
    const { zoom, duration } = inputsRef.current;
    const fit = (wave.current?.clientWidth ?? 800) / Math.max(1, duration);
    ws.zoom(zoom > 0 ? Math.max(zoom, fit) : fit);
  }, [wave, inputsRef]);

  useEffect(() => {
    let cancelled = false;
    let ws: WaveSurfer | null = null;
    const video = elements.video.current;
    const { playlistUrl, peaks, duration, playhead } = inputsRef.current;
    const media = attachHls(video, playlistUrl, () =>
      inputsRef.current.onMediaError('The recording could not be played here. Reload the page; if it keeps happening, the waveform and marks still work.'),
    );

    void media.ready.then(() => {
      if (cancelled || !elements.wave.current) return;
      const regions = RegionsPlugin.create();
      regionsRef.current = regions;
      const data = peaks ? envelope(peaks) : new Float32Array(Math.max(1, Math.ceil(duration * 10)));
      ws = WaveSurfer.create({
        container: elements.wave.current,
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
            container: elements.ruler.current ?? undefined,
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
        syncProposal();
        applyZoom();
        inputsRef.current.onReady();
      });
      regions.on('region-updated', (region, side) => {
        const p = inputsRef.current;
        if (region.id.startsWith(CUE_PREFIX)) p.onCueDragged(region.id.slice(CUE_PREFIX.length), region.start, altHeld.current);
        else if (side) p.onEdgeDragged(region.id, side, side === 'start' ? region.start : region.end, altHeld.current);
        else p.onSegmentDragged(region.id, region.start, altHeld.current);
        // The state decides where the edge ends up (snapped, clamped); put the region back in line.
        setTimeout(() => syncRegions(true), 0);
      });
      regions.on('region-clicked', (region, e) => {
        e.stopPropagation();
        const p = inputsRef.current;
        if (region.id.startsWith(PROPOSAL_PREFIX)) p.onProposalPicked(Number(region.id.slice(PROPOSAL_PREFIX.length)));
        else if (region.id.startsWith(CUE_PREFIX)) p.onSelect({ type: 'cue', id: region.id.slice(CUE_PREFIX.length) });
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
      regionSync.clear();
      proposalMarkers.clear();
      ws?.destroy();
      media.destroy();
      wsRef.current = null;
      regionsRef.current = null;
    };
    // The media and waveform are rebuilt only when the recording itself changes.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [inputs.playlistUrl, inputs.peaks, inputs.duration]);

  useEffect(() => syncRegions(), [inputs.timeline, syncRegions]);
  useEffect(() => syncProposal(), [inputs.proposal, syncProposal]);
  useEffect(() => regionSync.showSelection(inputs.selection), [inputs.selection, regionSync]);
  useEffect(() => applyZoom(), [inputs.zoom, applyZoom]);

  return wsRef;
}

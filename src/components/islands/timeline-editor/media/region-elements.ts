/** DOM pieces the waveform's regions show: segment labels and patterns, cue pins, the envelope. */
import type { Region } from 'wavesurfer.js/dist/plugins/regions.esm.js';
import type { Peaks } from '~/lib/media/peaks';
import type { Segment } from '~/lib/timeline/timeline-schema';
import { SEGMENT_KIND_PATTERNS, SEGMENT_KIND_TAGS } from '~/lib/editor/segment-style';

export const CUE_PREFIX = 'cue:';
export const MINT = '#3BB273';

/** One mono envelope (the louder of min and max per bin), which is all the waveform draws. */
export function envelope(peaks: Peaks): Float32Array {
  const out = new Float32Array(peaks.min.length);
  for (let i = 0; i < out.length; i++) out[i] = Math.max(Math.abs(peaks.min[i] as number), Math.abs(peaks.max[i] as number));
  return out;
}

export function segmentLabel(s: Segment): string {
  return (
    SEGMENT_KIND_TAGS[s.kind] +
    (s.exercise ? ` · ${s.exercise}` : '') +
    (s.round ? ` · R${s.round}` : '') +
    (s.set ? ` · set ${s.set}` : '')
  );
}

export function labelElement(text: string): HTMLElement {
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

export function pinElement(): HTMLElement {
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

export function styleSegmentElement(region: Region, s: Segment) {
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

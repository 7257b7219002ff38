/**
 * How each segment and cue kind looks in the timeline editor: colour (design brief palette),
 * a short text label and a pattern, so a kind never rests on colour alone.
 */
import type { CueKind, SegmentKind } from '../timeline/timeline-schema';

/** Background colour per segment kind (design brief palette). */
export const KIND_COLOURS: Record<SegmentKind, string> = {
  work: '#E4572E',
  rest: '#2E86AB',
  warmup: '#F2A541',
  cooldown: '#6C5B7B',
  'round-break': '#8A94A6',
  talk: '#C9C2B6',
  intro: '#C9C2B6',
  outro: '#C9C2B6',
};


/** Words shown in the editor for each segment kind. */
export const SEGMENT_KIND_LABELS: Record<SegmentKind, string> = {
  work: 'Work',
  rest: 'Rest',
  'round-break': 'Round break',
  warmup: 'Warm-up',
  cooldown: 'Cool-down',
  talk: 'Talk',
  intro: 'Intro',
  outro: 'Outro',
};

/** Short tags drawn on the spans (narrow spans have little room). */
export const SEGMENT_KIND_TAGS: Record<SegmentKind, string> = {
  work: 'WORK',
  rest: 'REST',
  'round-break': 'BREAK',
  warmup: 'WARM',
  cooldown: 'COOL',
  talk: 'TALK',
  intro: 'INTRO',
  outro: 'OUTRO',
};

const stripes = (angle: number, gap: number) =>
  `repeating-linear-gradient(${angle}deg, rgba(255,255,255,0.5) 0 2px, transparent 2px ${gap}px)`;
const dots = 'radial-gradient(rgba(255,255,255,0.6) 1.5px, transparent 1.7px)';

/** CSS background patterns laid over the kind's colour; work stays solid, the strongest mark. */
export const SEGMENT_KIND_PATTERNS: Record<SegmentKind, { image: string; size: string }> = {
  work: { image: 'none', size: 'auto' },
  rest: { image: stripes(45, 8), size: 'auto' },
  'round-break': { image: stripes(0, 7), size: 'auto' },
  warmup: { image: stripes(-45, 10), size: 'auto' },
  cooldown: { image: stripes(90, 8), size: 'auto' },
  talk: { image: dots, size: '8px 8px' },
  intro: { image: dots, size: '8px 8px' },
  outro: { image: dots, size: '8px 8px' },
};

/** Order of kinds in menus and the digit keys that set them (1 = work ... 8 = outro). */
export const SEGMENT_KIND_ORDER: readonly SegmentKind[] = ['work', 'rest', 'round-break', 'warmup', 'cooldown', 'talk', 'intro', 'outro'];

export const CUE_KIND_LABELS: Record<CueKind, string> = {
  countdown: 'Countdown',
  form: 'Form tip',
  option: 'Easier/harder option',
  safety: 'Safety',
  note: 'Note',
};

/** `#RRGGBB` with an alpha, for translucent spans over the waveform. */
export function withAlpha(hex: string, alpha: number): string {
  const n = Number.parseInt(hex.slice(1), 16);
  return `rgba(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255}, ${alpha})`;
}

import type { Segment } from '../timeline/timeline-schema';

/** How members read each part of a class (chapter titles, the interval clock). */
export const PART_NAMES: Record<Segment['kind'], string> = {
  intro: 'Welcome',
  warmup: 'Warm-up',
  work: 'Work',
  rest: 'Rest',
  'round-break': 'Round break',
  cooldown: 'Cool-down',
  outro: 'Wrap-up',
  talk: 'Coach talk',
};

/** The general caution shown on every class page and before a member's first play (design brief, Safety). */
export const GENERAL_CAUTION = [
  'Check with a physician before starting a new exercise programme, especially if you are pregnant, injured or have a health condition.',
  'Stop if you feel pain, dizziness or shortness of breath.',
  'When unsure, choose the easier option the coach shows.',
] as const;
export const CAUTION_FOOTNOTE = 'General information, not medical advice. Local rules and qualified professionals come first.';

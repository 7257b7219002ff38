import type { CaptionCue } from '~/lib/captions/caption-schema';
import type { Timeline } from '~/lib/timeline/timeline-schema';

/** What the coach says during each Desk-Break Mobility station (invented demo text). */
const STATION_LINES: Record<string, string> = {
  'Neck release': 'Ear towards the shoulder, let the weight of the head do the work.',
  'Shoulder circles': 'Big slow circles, lift the shoulders up, back and down.',
  'Cat-cow': 'Hands on the desk, round the back, then lengthen through the chest.',
  'Thoracic rotation': 'Hips stay still, turn from the middle of the back.',
  'Hip flexor stretch': 'Small step back, tuck the tailbone, feel the front of the hip open.',
  'Reverse lunge': 'Step back softly, hold the desk if you need the balance.',
};

/**
 * Captions for a demo class, following its marked timeline: the coach's words at each part
 * (invented demo text). They are not yet derived from the demo soundtrack's own spoken lines
 * (lib/media/class-soundtrack.ts), so they do not caption its count or music.
 */
export function demoCaptions(timeline: Timeline): CaptionCue[] {
  const cues: CaptionCue[] = [];
  const add = (startSeconds: number, endSeconds: number, text: string) => cues.push({ startSeconds, endSeconds, text });
  const segments = [...timeline.segments].sort((a, b) => a.startSeconds - b.startSeconds);
  const rounds = Math.max(1, ...segments.map((s) => s.round ?? 1));
  segments.forEach((s, i) => {
    const next = segments[i + 1];
    const at = s.startSeconds;
    if (s.kind === 'intro') {
      add(at + 0.5, at + 6, 'Welcome to Desk-Break Mobility: ten quiet minutes, no equipment.');
      add(at + 6.5, at + 13, 'Move gently, and stop if anything hurts or you feel dizzy.');
    } else if (s.kind === 'work' && s.exercise) {
      add(at, at + 4, `${s.exercise}${rounds > 1 && s.round ? `, round ${s.round} of ${rounds}` : ''}.`);
      const line = STATION_LINES[s.exercise];
      if (line) add(at + 6, at + 13, line);
      add(s.endSeconds - 6, s.endSeconds - 1, 'Keep breathing, a few more seconds.');
    } else if (s.kind === 'rest') {
      add(at, at + 4, `Rest.${next?.exercise ? ` Next: ${next.exercise}.` : ''}`);
    } else if (s.kind === 'outro') {
      add(at, at + 6, 'Well done. Roll the shoulders once more before you sit back down.');
      add(at + 6.5, s.endSeconds - 2, 'Have some water. See you at the next desk break.');
    }
  });
  return cues;
}

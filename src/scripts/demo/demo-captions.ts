import type { CaptionCue } from '~/lib/captions/caption-schema';
import type { ChangeSignal, SoundtrackScore, SpokenLine } from '~/lib/media/class-soundtrack';
import type { Timeline } from '~/lib/timeline/timeline-schema';
import { DEMO_FPS, demoSoundtrackScore, demoSpans } from './demo-spans';

/**
 * How long a spoken line stays on screen: about 0.4 s a word plus a little, at least 1.2 s.
 * A rule of thumb for a speech synthesiser's default pace (common practice, no source); the
 * next coach line cuts it short, so captions never pile up behind the voice.
 */
const SECONDS_PER_WORD = 0.4;
const MIN_CAPTION_SECONDS = 1.2;

const words = (text: string) => text.trim().split(/\s+/).length;
const sentence = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/** The caption text of one spoken line: the coach's words as said, others marked as from the room. */
export function captionText(line: SpokenLine): string {
  return line.voice === 'chatter' ? `[In the room] ${sentence(line.text)}` : `${sentence(line.text)}.`;
}

/**
 * Captions of a demo soundtrack: one caption per spoken line, starting when it is spoken, and
 * the music marked where it starts (captions carry the sounds that matter, HTML Standard, the
 * track element's `captions` kind).
 */
export function captionsFromScore(score: SoundtrackScore): CaptionCue[] {
  const coachStarts = score.lines.filter((l) => l.voice === 'coach').map((l) => l.atSeconds);
  const cues: CaptionCue[] = score.lines.map((line) => {
    const said = Math.max(MIN_CAPTION_SECONDS, words(line.text) * SECONDS_PER_WORD + 0.4);
    const nextCoach = line.voice === 'coach' ? coachStarts.find((t) => t > line.atSeconds + 0.05) : undefined;
    // Half a second inside the end: the measured recording may come out a frame shorter.
    const end = Math.min(line.atSeconds + said, nextCoach ?? Infinity, score.durationSeconds - 0.5);
    return { startSeconds: line.atSeconds, endSeconds: end, text: captionText(line) };
  });
  if (score.music.to - score.music.from > 3) {
    cues.push({ startSeconds: score.music.from, endSeconds: score.music.from + 3, text: '[Music starts, quietly]' });
  }
  // WebVTT §4.1: cue starts never go backwards; times in milliseconds as the schema stores them.
  return cues
    .map((c) => ({ ...c, startSeconds: Math.round(c.startSeconds * 1000) / 1000, endSeconds: Math.round(c.endSeconds * 1000) / 1000 }))
    .filter((c) => c.endSeconds > c.startSeconds)
    .sort((a, b) => a.startSeconds - b.startSeconds);
}

/**
 * Captions for a demo class: the words its generated recording speaks, at the times they are
 * spoken. Built from the same score the demo recording job mixes (same spans, frame rate and
 * change signal), so the words and times match what members hear (invented demo content).
 */
export function demoCaptions(timeline: Timeline, mediaSeconds: number, signal: ChangeSignal): CaptionCue[] {
  return captionsFromScore(demoSoundtrackScore(demoSpans(timeline.segments, mediaSeconds), DEMO_FPS, signal));
}

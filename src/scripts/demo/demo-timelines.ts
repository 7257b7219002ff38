import type { ExpectedSchedule } from '~/lib/plan/expand-plan';
import type { Cue, Segment, Timeline } from '~/lib/timeline/timeline-schema';

/** Seconds of coach talk before the first planned part and after the last in demo recordings. */
export const DEMO_INTRO_SECONDS = 15;
export const DEMO_OUTRO_SECONDS = 15;

/**
 * A correctly marked demo timeline: an intro, the plan's schedule, an outro, a count-in cue
 * 3 s before each work interval and a form cue early in the first of each exercise.
 * Invented demo content.
 */
export function demoTimeline(schedule: ExpectedSchedule): Timeline {
  const segments: Segment[] = [{ id: 'intro', kind: 'intro', startSeconds: 0, endSeconds: DEMO_INTRO_SECONDS, title: 'Welcome' }];
  const cues: Cue[] = [];
  const formTipped = new Set<string>();
  for (const p of schedule.segments) {
    const start = DEMO_INTRO_SECONDS + p.startSeconds;
    segments.push({
      id: `s${p.index + 1}`,
      kind: p.kind,
      startSeconds: start,
      endSeconds: start + p.seconds,
      ...(p.exercise ? { exercise: p.exercise } : {}),
      ...(p.round ? { round: p.round } : {}),
      ...(p.set ? { set: p.set } : {}),
    });
    if (p.kind === 'work') {
      cues.push({ id: `c${cues.length + 1}`, atSeconds: start - 3, kind: 'countdown', text: '3, 2, 1, go' });
      if (p.exercise && !formTipped.has(p.exercise)) {
        formTipped.add(p.exercise);
        cues.push({ id: `c${cues.length + 1}`, atSeconds: start + 5, kind: 'form', text: `${p.exercise}: slow and controlled before you speed up.` });
        cues.push({ id: `c${cues.length + 1}`, atSeconds: start + 12, kind: 'option', text: 'Easier option on screen any time you need it.' });
      }
    }
  }
  const end = DEMO_INTRO_SECONDS + schedule.totals.classSeconds;
  segments.push({ id: 'outro', kind: 'outro', startSeconds: end, endSeconds: end + DEMO_OUTRO_SECONDS, title: 'Well done' });
  return { segments, cues };
}


/**
 * The draft's deliberate marking mistakes (design brief): one work interval 9 s long, an overlap,
 * and a station the coach skipped in round 3 (later marks move up to close the hole).
 */
export function withDeliberateMistakes(timeline: Timeline): Timeline {
  const segments = timeline.segments.map((s) => ({ ...s }));
  const works = (round: number) => segments.filter((s) => s.kind === 'work' && s.round === round);
  // 1. Round 1, second station: the end was marked 9 s after the start.
  const short = works(1)[1]!;
  short.endSeconds = short.startSeconds + 9;
  // 2. Round 2, third station starts 2.5 s before the rest before it ends.
  const early = works(2)[2]!;
  early.startSeconds -= 2.5;
  // 3. Round 3, second station was skipped: drop its work and rest and move later marks up.
  const skipped = works(3)[1]!;
  const i = segments.indexOf(skipped);
  const rest = segments[i + 1]!;
  const hole = rest.endSeconds - skipped.startSeconds;
  segments.splice(i, 2);
  for (const s of segments.slice(i)) {
    s.startSeconds -= hole;
    s.endSeconds -= hole;
  }
  const cues = timeline.cues
    .filter((c) => c.atSeconds < skipped.startSeconds - 3 || c.atSeconds >= rest.endSeconds)
    .map((c) => (c.atSeconds >= rest.endSeconds ? { ...c, atSeconds: c.atSeconds - hole } : c));
  return { segments, cues };
}

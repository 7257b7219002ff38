import type { Chapter } from '~/lib/publishing/chapters';
import { formatClock } from '~/lib/time/format-time';
import type { ExerciseNote } from './types';

const KIND_SWATCH: Record<string, string> = {
  work: 'bg-ember',
  rest: 'bg-tide',
  warmup: 'bg-sun',
  cooldown: 'bg-dusk',
  'round-break': 'bg-slate',
};

/** The chapter list: thumbnail, title, length; the current one is marked for sight and screen readers. */
export function ChapterList(props: {
  chapters: Chapter[];
  current: number;
  thumbnailBase: string;
  notes: Map<string, ExerciseNote>;
  onJump: (chapter: Chapter) => void;
}) {
  return (
    <ol className="flex flex-col gap-1" aria-label="Chapters">
      {props.chapters.map((c) => {
        const isCurrent = c.index === props.current;
        // Notes show at an exercise's first chapter and whenever it is the one playing.
        const first = props.chapters.findIndex((o) => o.exercise === c.exercise) === c.index;
        const note = c.exercise && (first || isCurrent) ? props.notes.get(c.exercise.toLowerCase()) : undefined;
        return (
          <li key={c.index}>
            <button
              type="button"
              onClick={() => props.onJump(c)}
              aria-current={isCurrent ? 'step' : undefined}
              data-chapter={c.index + 1}
              className={`flex w-full items-center gap-3 rounded-[10px] p-2 text-left hover:bg-paper ${isCurrent ? 'bg-sun/20 ring-2 ring-sun' : ''}`}
            >
              <span className="relative h-12 w-20 shrink-0 overflow-hidden rounded-[4px] bg-stone/40">
                {/* A background image: a thumbnail still being made shows the plain swatch, never a broken-image icon. */}
                <span className="absolute inset-0 bg-cover bg-center" style={{ backgroundImage: `url(${props.thumbnailBase}${c.index + 1}.jpg)` }} />
                <span className={`absolute bottom-0 left-0 h-1 w-full ${KIND_SWATCH[c.kind] ?? 'bg-stone'}`} aria-hidden="true" />
              </span>
              <span className="min-w-0 flex-1">
                <span className="block font-semibold leading-tight">{c.title}</span>
                <span className="block text-sm text-ink-soft tabular">
                  {formatClock(c.startSeconds)} · {formatClock(c.endSeconds - c.startSeconds)}
                </span>
                {c.exercises && c.exercises.length > 0 && (
                  <span className="block text-sm" data-chapter-repeat>
                    Repeat: {c.exercises.join(' · ')}
                  </span>
                )}
                {c.exercises?.map((name) => props.notes.get(name.toLowerCase())?.cautions).filter(Boolean).map((caution) => (
                  <span key={caution} className="block text-xs text-warning">{caution}</span>
                ))}
                {note?.easierOption && <span className="block text-xs text-ink-soft">Easier: {note.easierOption}</span>}
                {note?.cautions && <span className="block text-xs text-warning">{note.cautions}</span>}
              </span>
              {isCurrent && <span className="text-xs font-bold uppercase text-ember-deep">Now</span>}
            </button>
          </li>
        );
      })}
    </ol>
  );
}

import { clockHeading, type ClockState } from '~/lib/publishing/interval-clock';
import { formatClock } from '~/lib/time/format-time';
import type { ExerciseNote } from './types';

const KIND_RING: Record<string, string> = {
  work: '#E4572E',
  rest: '#2E86AB',
  warmup: '#F2A541',
  cooldown: '#6C5B7B',
  'round-break': '#8A94A6',
};

/**
 * The overlay members follow from their mat: big digits and a ring for the time left, the part
 * now on (always in words, never colour alone), the round, and what comes next.
 */
export function IntervalClock({ clock, note, repeat }: { clock: ClockState; note: ExerciseNote | undefined; repeat?: readonly string[] | undefined }) {
  const { current } = clock;
  const share = clock.length > 0 ? clock.remaining / clock.length : 0;
  const r = 54;
  const circumference = 2 * Math.PI * r;
  const colour = (current && KIND_RING[current.kind]) ?? '#C9C2B6';
  const heading = clockHeading(clock);
  return (
    <div
      // Below 640 px (phones) the clock would cover the whole video, so it sits under it in a
      // compact form: no ring, the time left in digits about 14 mm tall on a phone (readable from
      // the mat, 2–3 m away), the words beside them. From 640 px it is the overlay with the ring.
      className="pointer-events-none flex flex-wrap items-center gap-x-4 gap-y-1 bg-ink p-3 text-paper sm:absolute sm:right-3 sm:top-3 sm:max-w-[22rem] sm:flex-nowrap sm:rounded-[10px] sm:bg-ink/85 sm:p-4 sm:shadow-lg"
      role="timer"
      aria-live="off"
      aria-label="Interval clock"
      data-testid="interval-clock"
    >
      <p className="text-[7.5rem] font-extrabold leading-none tabular sm:hidden" data-testid="clock-remaining">
        {formatClock(Math.ceil(clock.remaining))}
      </p>
      <svg width="128" height="128" viewBox="0 0 128 128" aria-hidden="true" className="hidden shrink-0 sm:block">
        <circle cx="64" cy="64" r={r} fill="none" stroke="rgba(255,255,255,0.15)" strokeWidth="12" />
        <circle
          cx="64"
          cy="64"
          r={r}
          fill="none"
          stroke={colour}
          strokeWidth="12"
          strokeLinecap="round"
          // With prefers-reduced-motion the ring stands still (global.css); the digits carry the time.
          data-clock-ring-progress
          strokeDasharray={circumference}
          strokeDashoffset={circumference * (1 - share)}
          transform="rotate(-90 64 64)"
        />
        <text x="64" y="74" textAnchor="middle" fontSize="32" fontWeight="800" fill="currentColor" style={{ fontVariantNumeric: 'tabular-nums' }}>
          {formatClock(Math.ceil(clock.remaining))}
        </text>
      </svg>
      <div className="min-w-0">
        {heading && (
          <p className="text-sm uppercase tracking-wide text-stone" data-testid="clock-kind">
            {heading}
          </p>
        )}
        <p className="text-2xl font-extrabold leading-tight" data-testid="clock-now">
          {current?.label ?? clock.next?.label ?? ''}
        </p>
        {clock.round && clock.rounds && clock.rounds > 1 && (
          <p className="font-semibold tabular" data-testid="clock-round">
            Round {clock.round} of {clock.rounds}
          </p>
        )}
        {clock.set && (
          <p className="font-semibold tabular">
            Set {clock.set}
            {clock.sets ? ` of ${clock.sets}` : ''}
          </p>
        )}
        {clock.next && (
          <p className="text-sm text-stone" data-testid="clock-next">
            Next: {clock.next.label} in <span className="tabular">{formatClock(Math.ceil(clock.next.inSeconds))}</span>
          </p>
        )}
        {repeat && repeat.length > 0 && current?.kind === 'work' && (
          // An AMRAP's span has no exercise of its own: members need the list they repeat.
          <p className="text-sm font-semibold" data-testid="clock-repeat">
            Repeat: {repeat.join(' · ')}
          </p>
        )}
        {note && current?.kind === 'work' && (note.easierOption || note.cautions) && (
          <p className="mt-1 text-sm text-sun">
            {note.easierOption ? `Easier: ${note.easierOption}` : ''}
            {note.cautions ? `${note.easierOption ? ' · ' : ''}${note.cautions}` : ''}
          </p>
        )}
      </div>
    </div>
  );
}

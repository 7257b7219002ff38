import type { EditorView } from './controller/use-editor-controller';
import type { ProposalState } from './controller/use-proposal';
import { formatEditorTime } from '~/lib/time/format-time';
import { toolButton } from './tool-button';
import { EVIDENCE_WORDS, describeBoundary, type ProposalMarkers } from './media/proposal-markers';

/** What the waveform draws of the open proposal (null when none is open). */
export function proposalMarkers(s: ProposalState): ProposalMarkers | null {
  return s.status === 'open' ? { boundaries: s.proposal.boundaries, reviewBelow: s.proposal.reviewBelow, reviewing: s.reviewing } : null;
}

/** The toolbar button: also offered on an empty timeline right after upload. */
export function MarkItForMeButton({ c }: { c: EditorView }) {
  const missing = !c.plan ? 'Add the class plan first' : !c.data.recording ? 'Available once a recording is ready' : null;
  return (
    <button
      type="button"
      className={toolButton}
      onClick={() => void c.proposal.request()}
      disabled={missing !== null || c.proposal.state.status === 'loading'}
      title={missing ?? "Proposes the whole timeline from the recording's beeps, whistles and counts, following the plan"}
      data-mark-it
    >
      {c.proposal.state.status === 'loading' ? 'Listening…' : 'Mark it for me'}
    </button>
  );
}

/**
 * The panel of an open proposal. Its boundaries are drawn inside the waveform (uncertain ones
 * highlighted); here are the summary, the uncertain ones as buttons (for the keyboard), and
 * U / Next uncertain, Accept and Discard.
 */
export function ProposalLayer({ c }: { c: EditorView }) {
  const s = c.proposal.state;
  if (s.status === 'error') {
    return (
      <p role="alert" className="rounded-[10px] bg-error/10 p-3 text-sm font-semibold text-error">
        {s.message}{' '}
        <button type="button" className="underline" onClick={c.proposal.discard}>Close</button>
      </p>
    );
  }
  if (s.status !== 'open') return null;
  const { proposal, reviewing } = s;
  const uncertain = proposal.boundaries.flatMap((b, i) => (b.confidence < proposal.reviewBelow ? [{ b, i }] : []));
  const current = reviewing !== null ? proposal.boundaries[reviewing] : undefined;
  return (
    <section aria-label="Proposed timeline" className="flex flex-col gap-3 rounded-[10px] border border-ink/30 bg-chalk p-3" data-proposal>
      <p className="text-sm font-semibold">
        Proposed: {proposal.segments.length} segments, {proposal.boundaries.length} boundaries, drawn as dashed lines in the waveform.{' '}
        {proposal.method === 'plan-only'
          ? 'No beeps, whistles or counts were heard: every boundary is placed by the plan. Check them all.'
          : uncertain.length === 0
            ? 'Every boundary matched a sound.'
            : `${uncertain.length} uncertain ${uncertain.length === 1 ? 'boundary is' : 'boundaries are'} highlighted with “?”: check ${uncertain.length === 1 ? 'it' : 'them'} before accepting.`}
      </p>
      {uncertain.length > 0 && (
        <ul className="flex flex-wrap gap-1" aria-label="Uncertain boundaries">
          {uncertain.map(({ b, i }) => (
            <li key={i}>
              <button
                type="button"
                onClick={() => c.proposal.review(i)}
                className={`rounded border-2 border-warning px-2 text-sm tabular-nums ${reviewing === i ? 'bg-warning text-chalk' : 'bg-chalk'}`}
                aria-label={describeBoundary(b, proposal.reviewBelow)}
                aria-pressed={reviewing === i}
                data-uncertain-item
              >
                {formatEditorTime(b.atSeconds)}
              </button>
            </li>
          ))}
        </ul>
      )}
      {current && (
        <p className="text-sm" aria-live="polite" data-reviewing>
          Playing around {formatEditorTime(current.atSeconds)}: {EVIDENCE_WORDS[current.evidence]}, confidence {Math.round(current.confidence * 100)} %.
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        <button type="button" className={toolButton} onClick={c.proposal.nextUncertain} disabled={uncertain.length === 0} aria-keyshortcuts="U">
          Next uncertain (U)
        </button>
        <button type="button" className={toolButton} onClick={c.proposal.accept}>Accept proposal</button>
        <button type="button" className={toolButton} onClick={c.proposal.discard}>Discard</button>
      </div>
      <p className="text-xs text-ink-soft">Accepting replaces the current marks; Undo (Ctrl + Z) brings them back. Save as usual afterwards.</p>
    </section>
  );
}

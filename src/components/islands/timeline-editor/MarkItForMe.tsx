import type { EditorView } from './controller/use-editor-controller';
import { formatEditorTime } from '~/lib/time/format-time';
import { toolButton } from './tool-button';

const EVIDENCE_WORDS = { tone: 'timer beep', whistle: 'whistle', voice: 'spoken count', energy: 'music change', plan: 'no sound; placed by the plan' } as const;

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
 * The proposal as a layer over the recording's length: every proposed boundary, the uncertain
 * ones highlighted; U (or the button) plays 3 s around the next uncertain one; Accept adopts it.
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
  const uncertain = proposal.boundaries.filter((b) => b.confidence < proposal.reviewBelow).length;
  const total = c.mediaSeconds || 1;
  const current = reviewing !== null ? proposal.boundaries[reviewing] : undefined;
  return (
    <section aria-label="Proposed timeline" className="flex flex-col gap-3 rounded-[10px] border border-ink/30 bg-chalk p-3" data-proposal>
      <p className="text-sm font-semibold">
        Proposed: {proposal.segments.length} segments, {proposal.boundaries.length} boundaries.{' '}
        {proposal.method === 'plan-only'
          ? 'No beeps, whistles or counts were heard: every boundary is placed by the plan. Check them all.'
          : uncertain === 0
            ? 'Every boundary matched a sound.'
            : `${uncertain} uncertain ${uncertain === 1 ? 'boundary is' : 'boundaries are'} highlighted: check ${uncertain === 1 ? 'it' : 'them'} before accepting.`}
      </p>
      <div className="relative h-8 rounded bg-paper" role="list" aria-label="Proposed boundaries along the recording">
        {proposal.boundaries.map((b, i) => {
          const low = b.confidence < proposal.reviewBelow;
          return (
            <button
              key={i}
              type="button"
              role="listitem"
              onClick={() => c.proposal.review(i)}
              className={`absolute top-0 h-full -translate-x-1/2 ${low ? 'w-1.5 bg-warning' : 'w-0.5 bg-ink/60'} ${reviewing === i ? 'outline outline-2 outline-ink' : ''}`}
              style={{ left: `${Math.min(100, (100 * b.atSeconds) / total)}%` }}
              title={`${formatEditorTime(b.atSeconds)} · ${EVIDENCE_WORDS[b.evidence]} · confidence ${Math.round(b.confidence * 100)} %`}
              aria-label={`Boundary at ${formatEditorTime(b.atSeconds)}, ${EVIDENCE_WORDS[b.evidence]}, confidence ${Math.round(b.confidence * 100)} percent${low ? ', uncertain' : ''}`}
              data-uncertain={low ? 'true' : undefined}
            />
          );
        })}
      </div>
      {current && (
        <p className="text-sm" aria-live="polite" data-reviewing>
          Playing around {formatEditorTime(current.atSeconds)}: {EVIDENCE_WORDS[current.evidence]}, confidence {Math.round(current.confidence * 100)} %.
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        <button type="button" className={toolButton} onClick={c.proposal.nextUncertain} disabled={uncertain === 0} aria-keyshortcuts="U">
          Next uncertain (U)
        </button>
        <button type="button" className={toolButton} onClick={c.proposal.accept}>Accept proposal</button>
        <button type="button" className={toolButton} onClick={c.proposal.discard}>Discard</button>
      </div>
      <p className="text-xs text-ink-soft">Accepting replaces the current marks; Undo (Ctrl + Z) brings them back. Save as usual afterwards.</p>
    </section>
  );
}

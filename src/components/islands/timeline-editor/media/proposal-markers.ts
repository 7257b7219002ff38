/**
 * "Mark it for me" inside the waveform: every proposed boundary is a marker region over the
 * recording, uncertain ones wide and in the warning colour (with a "?" so colour is not the only
 * sign), the one under review outlined. Kept apart from the timeline's own regions (RegionSync),
 * which never touches ids with this prefix.
 */
import type RegionsPlugin from 'wavesurfer.js/dist/plugins/regions.esm.js';
import type { Region } from 'wavesurfer.js/dist/plugins/regions.esm.js';
import { formatEditorTime } from '~/lib/time/format-time';

type Regions = ReturnType<typeof RegionsPlugin.create>;

export const PROPOSAL_PREFIX = 'proposal:';
const WARNING = '#B54708';
const INK = '#172033';

/** What the waveform shows of an open proposal. */
export interface ProposalMarkers {
  boundaries: readonly { atSeconds: number; confidence: number; evidence: string }[];
  reviewBelow: number;
  /** Index of the boundary being reviewed, if any. */
  reviewing: number | null;
}

export const EVIDENCE_WORDS: Record<string, string> = {
  tone: 'timer beep',
  whistle: 'whistle',
  voice: 'spoken count',
  energy: 'music change',
  plan: 'no sound; placed by the plan',
};

export function describeBoundary(b: ProposalMarkers['boundaries'][number], reviewBelow: number): string {
  const low = b.confidence < reviewBelow;
  return `Proposed boundary at ${formatEditorTime(b.atSeconds)}, ${EVIDENCE_WORDS[b.evidence] ?? b.evidence}, confidence ${Math.round(b.confidence * 100)} %${low ? ', uncertain' : ''}`;
}

function flag(): HTMLElement {
  const el = document.createElement('span');
  el.textContent = '?';
  Object.assign(el.style, {
    display: 'inline-block',
    marginLeft: '-7px',
    width: '14px',
    font: '800 11px/14px "Nunito Sans", ui-sans-serif, sans-serif',
    textAlign: 'center',
    color: '#FFFFFF',
    background: WARNING,
    borderRadius: '7px',
  } satisfies Partial<CSSStyleDeclaration>);
  return el;
}

/** Replaces the proposal's markers (a proposal is shown whole, so there is nothing to diff). */
export function createProposalMarkers() {
  let shown: Region[] = [];
  return {
    sync(regions: Regions, proposal: ProposalMarkers | null) {
      for (const r of shown) r.remove();
      shown = [];
      if (!proposal) return;
      proposal.boundaries.forEach((b, i) => {
        const low = b.confidence < proposal.reviewBelow;
        const region = regions.addRegion({
          id: `${PROPOSAL_PREFIX}${i}`,
          start: b.atSeconds,
          color: low ? WARNING : INK,
          drag: false,
          resize: false,
          ...(low ? { content: flag() } : {}),
        });
        const el = region.element;
        if (el) {
          el.title = describeBoundary(b, proposal.reviewBelow);
          el.setAttribute('aria-label', el.title);
          el.dataset.proposedBoundary = String(i);
          if (low) el.dataset.uncertain = 'true';
          el.style.borderLeft = low ? `4px solid ${WARNING}` : `2px dashed ${INK}`;
          el.style.zIndex = low ? '5' : '4';
          if (proposal.reviewing === i) {
            el.style.outline = `2px solid ${INK}`;
            el.dataset.reviewingNow = 'true';
          }
        }
        shown.push(region);
      });
    },
    clear() {
      shown = [];
    },
  };
}

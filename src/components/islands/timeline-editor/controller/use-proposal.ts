/**
 * "Mark it for me" in the editor: asks for a proposal, keeps it open as a layer for review,
 * plays around the uncertain boundaries one by one, and adopts it (undoable) on "Accept".
 */
import { useRef, useState, type Dispatch, type RefObject } from 'react';
import type { ProposalOutput } from '~/lib/api/marking-schemas';
import type { EditorAction } from '~/lib/editor/editor-state';
import { nextUncertainIndex, REVIEW_PLAY_SECONDS } from '~/lib/marking/review';
import { requestProposal } from '../editor-api';
import type { MediaTimelineHandle } from '../MediaTimeline';
import type { PlayheadStore } from '../playhead-store';
import { useLatest } from '../../use-latest';

export type ProposalState =
  | { status: 'idle' }
  | { status: 'loading' }
  | { status: 'error'; message: string }
  | { status: 'open'; proposal: ProposalOutput; reviewing: number | null };

export function useProposal(lessonId: string, dispatch: Dispatch<EditorAction>, media: RefObject<MediaTimelineHandle | null>, playhead: PlayheadStore) {
  const [state, setState] = useState<ProposalState>({ status: 'idle' });
  const stateRef = useLatest(state);
  const stopTimer = useRef<ReturnType<typeof setTimeout> | null>(null);

  const request = async () => {
    setState({ status: 'loading' });
    try {
      setState({ status: 'open', proposal: await requestProposal(lessonId), reviewing: null });
    } catch (err) {
      setState({ status: 'error', message: err instanceof Error ? err.message : 'The proposal could not be made. Try again.' });
    }
  };

  /** Plays REVIEW_PLAY_SECONDS around a boundary: from 1.5 s before to 1.5 s after. */
  const playAround = (atSeconds: number) => {
    const m = media.current;
    if (!m) return;
    if (stopTimer.current) clearTimeout(stopTimer.current);
    m.seek(Math.max(0, atSeconds - REVIEW_PLAY_SECONDS / 2));
    if (!playhead.playing()) m.playPause();
    stopTimer.current = setTimeout(() => {
      if (playhead.playing()) media.current?.playPause();
    }, REVIEW_PLAY_SECONDS * 1000);
  };

  const review = (index: number) => {
    const s = stateRef.current;
    if (s.status !== 'open') return;
    const b = s.proposal.boundaries[index];
    if (!b) return;
    setState({ ...s, reviewing: index });
    playAround(b.atSeconds);
  };

  const nextUncertain = () => {
    const s = stateRef.current;
    if (s.status !== 'open') return;
    const from = s.reviewing !== null ? s.proposal.boundaries[s.reviewing]!.atSeconds : -1;
    const index = nextUncertainIndex(s.proposal.boundaries, from, s.proposal.reviewBelow);
    if (index !== null) review(index);
  };

  const accept = () => {
    const s = stateRef.current;
    if (s.status !== 'open') return;
    const { segments, cues, boundaries, reviewBelow } = s.proposal;
    const uncertain = boundaries.filter((b) => b.confidence < reviewBelow).length;
    dispatch({
      type: 'replace',
      timeline: { segments, cues },
      keepHistory: true,
      notice: `Proposal adopted: ${segments.length} segments and ${cues.length} cues${uncertain ? `; ${uncertain} boundaries were uncertain` : ''}. Undo restores your previous marks.`,
    });
    setState({ status: 'idle' });
  };

  const discard = () => setState({ status: 'idle' });

  return { state, request, review, nextUncertain, accept, discard };
}

export type ProposalController = ReturnType<typeof useProposal>;

import { useEffect, useRef, useState } from 'react';
import type { CoverFrameOutput, CoverOutput } from '~/lib/api/cover-schemas';
import { formatEditorTime } from '~/lib/time/format-time';
import { ApiError, apiCall } from './api-client';
import { smallButton } from './plan-builder/fields';

type Progress =
  | { state: 'idle' }
  | { state: CoverFrameOutput['state']; at: number; message?: string }
  | { state: 'refused'; message: string };

/** How often the page asks how far the worker got (one frame takes a second or a few). */
const POLL_MS = 1000;

/**
 * "Use this frame as cover": reads where the timeline editor's video is paused, asks the worker
 * for that frame, follows its progress and hands the new cover up when it is done. The video is
 * the editor's own (`data-editor-video`), so the picture is exactly what staff see paused.
 */
export default function CoverFromFrame({ lessonId, disabled, onCover }: { lessonId: string; disabled: boolean; onCover: (cover: CoverOutput) => void }) {
  const [progress, setProgress] = useState<Progress>({ state: 'idle' });
  const alive = useRef(true);
  useEffect(() => () => { alive.current = false; }, []);
  const path = `/api/lessons/${lessonId}/cover`;

  async function follow(frame: CoverFrameOutput) {
    let current = frame;
    while (alive.current && (current.state === 'waiting' || current.state === 'working')) {
      setProgress({ state: current.state, at: current.atSeconds });
      await new Promise((r) => setTimeout(r, POLL_MS));
      current = await apiCall<CoverFrameOutput>('GET', `${path}/frame/${frame.id}`);
    }
    if (!alive.current) return;
    if (current.state === 'done') onCover(await apiCall<CoverOutput>('GET', path));
    setProgress({ state: current.state, at: current.atSeconds, message: current.message ?? undefined });
  }

  async function takeFrame() {
    const video = document.querySelector<HTMLVideoElement>('video[data-editor-video]');
    if (!video) {
      setProgress({ state: 'refused', message: 'There is no recording to take a frame from yet. Upload one, or upload a picture below.' });
      return;
    }
    video.pause();
    try {
      await follow(await apiCall<CoverFrameOutput>('POST', `${path}/frame`, { atSeconds: Math.round(video.currentTime * 1000) / 1000 }));
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      setProgress({ state: 'refused', message: err.fields?.atSeconds ? `${err.message} ${err.fields.atSeconds}` : err.message });
    }
  }

  const busy = progress.state === 'waiting' || progress.state === 'working';
  return (
    <div className="flex flex-col gap-2" data-cover-frame={progress.state}>
      <p className="text-sm text-ink-soft">Pause the recording in the Timeline above at the moment you like, then use that frame.</p>
      <div>
        <button type="button" className={smallButton} disabled={disabled || busy} onClick={() => void takeFrame()}>
          Use this frame as cover
        </button>
      </div>
      {busy && (
        <p role="status" aria-busy="true" className="text-sm font-semibold">
          {progress.state === 'waiting' ? `Waiting for the worker to take the picture at ${formatEditorTime(progress.at)}…` : `Taking the picture at ${formatEditorTime(progress.at)}…`}
        </p>
      )}
      {progress.state === 'done' && (
        <p role="status" className="font-semibold text-mint-deep">The frame at {formatEditorTime(progress.at)} is the cover now.</p>
      )}
      {(progress.state === 'failed' || progress.state === 'refused') && (
        <p role="alert" className="font-semibold text-error">{progress.message ?? 'The picture could not be taken. Try again, or upload a picture.'}</p>
      )}
    </div>
  );
}

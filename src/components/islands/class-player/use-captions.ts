import { useCallback, useEffect, useRef, useState } from 'react';
import { apiCall } from '../api-client';
import { useLatest } from '../use-latest';

/** The captions track of the video (our one `<track kind="captions">`), once the browser made it. */
function captionsTrack(v: HTMLVideoElement | null): TextTrack | undefined {
  return v ? Array.from(v.textTracks).find((t) => t.kind === 'captions') : undefined;
}

/**
 * Captions on or off, remembered with the member's account (PUT /api/me/player-preferences), so
 * the choice follows them to every device. Off is `hidden`, not `disabled`: the browser still
 * loads the cues, so turning captions on shows the current line at once. The browser's own
 * captions menu changes the same track; that choice is followed and remembered too.
 */
export function useCaptions(video: React.RefObject<HTMLVideoElement | null>, available: boolean, initiallyOn: boolean) {
  const [on, setOn] = useState(initiallyOn);
  const remembered = useRef(initiallyOn);
  const current = useLatest(on);

  const remember = useCallback((next: boolean) => {
    if (remembered.current === next) return;
    remembered.current = next;
    // A failed save only means the next visit starts with the old choice; the player goes on.
    void apiCall('PUT', '/api/me/player-preferences', { captionsOn: next }).catch(() => {
      remembered.current = !next;
    });
  }, []);

  useEffect(() => {
    const track = captionsTrack(video.current);
    if (track) track.mode = available && on ? 'showing' : 'hidden';
  }, [video, available, on]);

  useEffect(() => {
    const tracks = video.current?.textTracks;
    if (!tracks || !available) return;
    const onChange = () => {
      const track = captionsTrack(video.current);
      if (!track) return;
      const showing = track.mode === 'showing';
      setOn(showing);
      remember(showing);
    };
    tracks.addEventListener('change', onChange);
    return () => tracks.removeEventListener('change', onChange);
  }, [video, available, remember]);

  const toggle = useCallback(() => {
    const next = !current.current;
    setOn(next);
    remember(next);
  }, [current, remember]);

  return { captionsOn: on, toggleCaptions: toggle };
}

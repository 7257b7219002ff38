import { useCallback, useEffect, useRef, useState } from 'react';
import type { FinishSummary, ProgressRecordedOutput } from '~/lib/api/publish-schemas';

type Event = 'start' | 'progress' | 'seek' | 'chapter' | 'leave';

/**
 * Reports playback every 5 s, on seeks and chapter jumps, and on leaving (sendBeacon), with the
 * spans actually watched since the last report; the server decides when the class is finished.
 */
export function useProgress(lessonId: string, video: React.RefObject<HTMLVideoElement | null>) {
  const spanStart = useRef<number | null>(null);
  const pending = useRef<[number, number][]>([]);
  const [summary, setSummary] = useState<FinishSummary | null>(null);
  const url = `/api/lessons/${lessonId}/progress`;

  const closeSpan = useCallback(() => {
    const v = video.current;
    if (!v || spanStart.current === null) return;
    if (v.currentTime > spanStart.current) pending.current.push([spanStart.current, v.currentTime]);
    spanStart.current = v.paused ? null : v.currentTime;
  }, [video]);

  const report = useCallback(
    async (event: Event, fromSeconds?: number) => {
      const v = video.current;
      if (!v) return;
      closeSpan();
      const body = JSON.stringify({ positionSeconds: v.currentTime, watched: pending.current.splice(0), event, ...(fromSeconds !== undefined ? { fromSeconds } : {}) });
      if (event === 'leave') {
        navigator.sendBeacon(url, new Blob([body], { type: 'text/plain' }));
        return;
      }
      try {
        const res = await fetch(url, { method: 'POST', headers: { 'content-type': 'application/json' }, body });
        if (res.ok) {
          const data = (await res.json()) as ProgressRecordedOutput;
          if (data.justFinished && data.summary) setSummary(data.summary);
        }
      } catch {
        // Offline for a moment: the next report carries the position again.
      }
    },
    [closeSpan, url, video],
  );

  useEffect(() => {
    const v = video.current;
    if (!v) return;
    const onPlay = () => {
      spanStart.current = v.currentTime;
    };
    const onPause = () => {
      closeSpan();
      spanStart.current = null;
      void report('progress');
    };
    const onSeeking = () => {
      // The span ends where the member was, not where they jumped to.
      if (spanStart.current !== null && lastTime.current > spanStart.current) pending.current.push([spanStart.current, lastTime.current]);
      spanStart.current = null;
    };
    const lastTime = { current: v.currentTime };
    const onTime = () => {
      if (!v.seeking) lastTime.current = v.currentTime;
    };
    const onSeeked = () => {
      if (!v.paused) spanStart.current = v.currentTime;
    };
    const timer = window.setInterval(() => {
      if (!v.paused) void report('progress');
    }, 5000);
    const onLeave = () => void report('leave');
    v.addEventListener('play', onPlay);
    v.addEventListener('pause', onPause);
    v.addEventListener('seeking', onSeeking);
    v.addEventListener('seeked', onSeeked);
    v.addEventListener('timeupdate', onTime);
    window.addEventListener('pagehide', onLeave);
    return () => {
      window.clearInterval(timer);
      v.removeEventListener('play', onPlay);
      v.removeEventListener('pause', onPause);
      v.removeEventListener('seeking', onSeeking);
      v.removeEventListener('seeked', onSeeked);
      v.removeEventListener('timeupdate', onTime);
      window.removeEventListener('pagehide', onLeave);
    };
  }, [closeSpan, report, video]);

  return { report, summary, dismissSummary: () => setSummary(null) };
}

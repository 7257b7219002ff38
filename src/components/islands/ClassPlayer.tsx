import './zod-without-eval'; // first: before any schema is built
import { useEffect, useMemo, useRef, useState } from 'react';
import { ChapterList } from './class-player/ChapterList';
import { IntervalClock } from './class-player/IntervalClock';
import type { PlayerProps } from './class-player/types';
import { useProgress } from './class-player/use-progress';
import { useCaptions } from './class-player/use-captions';
import { clockAt, clockTimeline } from '~/lib/publishing/interval-clock';
import { parseTemporalFragment } from '~/lib/publishing/media-fragment';
import { startPosition, worthResuming, type NavigationKind } from '~/lib/publishing/start-position';
import type { Chapter } from '~/lib/publishing/chapters';
import { formatClock } from '~/lib/time/format-time';
import { CAUTION_FOOTNOTE, GENERAL_CAUTION } from '~/lib/publishing/member-words';

/** Index of the chapter playing at `t`. */
function chapterIndexAt(chapters: Chapter[], t: number): number {
  let idx = 0;
  for (const c of chapters) if (c.startSeconds <= t + 0.05) idx = c.index;
  return idx;
}

/**
 * The member's player: HLS video with a chapters track, the chapter list, the interval clock,
 * keyboard control, resume, the caution before a first play, and a short summary on finishing.
 */
export default function ClassPlayer(props: PlayerProps) {
  const video = useRef<HTMLVideoElement>(null);
  const [time, setTime] = useState(0);
  const [clockShown, setClockShown] = useState(true);
  const [cautionOk, setCautionOk] = useState(props.cautionAcknowledged);
  // The server cannot see the URL fragment; the effect below settles the offer with the rule in start-position.ts.
  const [resumeOffer, setResumeOffer] = useState(worthResuming(props.resumeAt, props.durationSeconds, props.finished));
  const [error, setError] = useState('');
  const timeline = useMemo(() => clockTimeline(props.segments), [props.segments]);
  const notes = useMemo(() => new Map(props.exercises.map((e) => [e.name.toLowerCase(), e])), [props.exercises]);
  const { report, summary, dismissSummary } = useProgress(props.lessonId, video);
  const { captionsOn, toggleCaptions } = useCaptions(video, !!props.captions, props.captionsOn);
  const clock = clockAt(timeline, time);
  const current = chapterIndexAt(props.chapters, time);

  // The HLS player is loaded only here, so other pages stay light.
  useEffect(() => {
    const v = video.current;
    if (!v) return;
    let destroy = () => {};
    // hls.js first wherever Media Source Extensions exist: some Chromium builds also claim native
    // HLS but refuse segments from another origin (the store), which is where segments live. The
    // browser's own player is the fallback where MSE is missing (older iPhones).
    // The light build (no subtitles, DRM or alternate audio, which classes do not use) keeps the page small.
    void import('hls.js/light').then(({ default: Hls }) => {
      if (!Hls.isSupported()) {
        if (v.canPlayType('application/vnd.apple.mpegurl')) v.src = props.playlistUrl;
        else setError('This browser cannot play the class. Try a current version of Chrome, Firefox, Safari or Edge.');
        return;
      }
      const hls = new Hls({ capLevelToPlayerSize: true });
      hls.on(Hls.Events.ERROR, (_e, data) => {
        if (data.fatal) setError('The video stopped loading. Check your connection, then reload the page to continue where you were.');
      });
      hls.loadSource(props.playlistUrl);
      hls.attachMedia(v);
      destroy = () => hls.destroy();
    });
    // The URL fragment and the navigation kind exist only in the browser, after hydration: an effect
    // is the place to read them, and the state set from them below is set once per video.
    /* eslint-disable react-hooks/set-state-in-effect */
    // A W3C Media Fragments link (#t=…) opens the class at that time when the member followed it;
    // on a reload it is the player's own leftover and the saved position wins (start-position.ts).
    const navigation = (performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming | undefined)?.type ?? 'navigate';
    const start = startPosition({
      fragmentStart: parseTemporalFragment(window.location.hash)?.start ?? null,
      navigation: navigation as NavigationKind,
      savedSeconds: props.resumeAt,
      durationSeconds: props.durationSeconds,
      finished: props.finished,
    });
    if (start.seekTo !== null) {
      v.currentTime = start.seekTo;
      setTime(start.seekTo);
    }
    setResumeOffer(start.offerResumeAt !== null);
    /* eslint-enable react-hooks/set-state-in-effect */
    return () => destroy();
  }, [props.playlistUrl, props.resumeAt, props.durationSeconds, props.finished]);

  useEffect(() => {
    const v = video.current;
    if (!v) return;
    let frame = 0;
    const tick = () => {
      setTime(v.currentTime);
      frame = v.paused ? 0 : requestAnimationFrame(tick);
    };
    const onPlay = () => {
      // Playing answers the resume offer: from here on it would only cover the video.
      setResumeOffer(false);
      frame = requestAnimationFrame(tick);
    };
    const onTime = () => setTime(v.currentTime);
    v.addEventListener('play', onPlay);
    v.addEventListener('seeked', onTime);
    v.addEventListener('timeupdate', onTime);
    return () => {
      cancelAnimationFrame(frame);
      v.removeEventListener('play', onPlay);
      v.removeEventListener('seeked', onTime);
      v.removeEventListener('timeupdate', onTime);
    };
  }, []);

  const seek = (t: number, event: 'seek' | 'chapter' = 'seek') => {
    const v = video.current;
    if (!v) return;
    const from = v.currentTime;
    v.currentTime = Math.min(Math.max(0, t), props.durationSeconds);
    setTime(v.currentTime);
    setResumeOffer(false);
    void report(event, from);
  };
  const jump = (c: Chapter) => {
    seek(c.startSeconds, 'chapter');
    history.replaceState(null, '', `#t=${Number(c.startSeconds.toFixed(3))}`);
  };

  const onKeyDown = (e: React.KeyboardEvent) => {
    if (e.target instanceof HTMLButtonElement && (e.key === ' ' || e.key === 'Enter')) return;
    const v = video.current;
    if (!v || !cautionOk) return;
    const map: Record<string, () => void> = {
      ' ': () => (v.paused ? void v.play() : v.pause()),
      k: () => (v.paused ? void v.play() : v.pause()),
      ArrowRight: () => seek(v.currentTime + 10),
      ArrowLeft: () => seek(v.currentTime - 10),
      n: () => {
        const next = props.chapters[current + 1];
        if (next) jump(next);
      },
      p: () => {
        const c = props.chapters[current];
        // Like a track list: back to the start of this chapter, or the one before when near its start.
        const target = c && v.currentTime - c.startSeconds > 3 ? c : props.chapters[Math.max(0, current - 1)];
        if (target) jump(target);
      },
      c: () => setClockShown((s) => !s),
      // T for the text of what is said: C already shows and hides the clock.
      ...(props.captions ? { t: toggleCaptions } : {}),
    };
    const action = map[e.key];
    if (action) {
      e.preventDefault();
      action();
    }
  };

  const acknowledge = async () => {
    const res = await fetch('/api/me/caution', { method: 'POST' });
    if (res.ok) {
      setCautionOk(true);
      void video.current?.play().catch(() => {});
    } else setError('We could not record your answer. Please try again.');
  };

  return (
    <div className="grid gap-6 lg:grid-cols-[2fr_1fr]" onKeyDown={onKeyDown}>
      <div>
        {/* A ring around the frame whenever the video or its own controls have focus: Chromium
            focuses the control bar inside the video, where the page's outline cannot reach. */}
        <div className="relative overflow-hidden rounded-[10px] bg-ink focus-within:ring-3 focus-within:ring-sun" tabIndex={-1}>
          <video
            ref={video}
            className="aspect-video w-full"
            poster={props.posterUrl}
            controls={cautionOk}
            playsInline
            preload="metadata"
            aria-label={`${props.title}: class video`}
            data-testid="class-video"
          >
            <track kind="chapters" src={props.chaptersUrl} srcLang="en" label="Chapters" default />
            {props.captions && <track kind="captions" src={props.captions.url} srcLang={props.captions.language} label={props.captions.label} />}
          </video>
          {clockShown && cautionOk && (
            <IntervalClock
              clock={clock}
              note={clock.current?.exercise ? notes.get(clock.current.exercise.toLowerCase()) : undefined}
              repeat={props.chapters[current]?.exercises}
            />
          )}
          {!cautionOk && (
            <div className="absolute inset-0 flex items-start justify-center overflow-y-auto bg-ink/90 p-4 text-paper sm:items-center sm:p-6" role="dialog" aria-modal="true" aria-labelledby="caution-title">
              <div className="max-w-lg">
                <h2 id="caution-title" className="text-2xl mb-2">Before your first class</h2>
                <ul className="list-disc space-y-1 pl-5">
                  {GENERAL_CAUTION.map((line) => (
                    <li key={line}>{line}</li>
                  ))}
                </ul>
                <p className="mt-2 text-sm text-stone">{CAUTION_FOOTNOTE}</p>
                <button type="button" onClick={() => void acknowledge()} className="mt-4 rounded-[10px] bg-sun px-4 py-2 font-bold text-ink" autoFocus>
                  I understand, let’s start
                </button>
              </div>
            </div>
          )}
        </div>
        {error && <p role="alert" className="mt-2 rounded-[10px] bg-error/10 p-3 font-semibold text-error">{error}</p>}
        <div className="mt-3 flex flex-wrap items-center gap-3">
          {resumeOffer && cautionOk && (
            <p className="flex items-center gap-2 rounded-[10px] bg-tide/10 p-2" data-testid="resume-offer">
              {/* One element, so the flex gap does not put a space before the full stop. */}
              <span>
                You stopped at <span className="font-bold tabular">{formatClock(props.resumeAt)}</span>.
              </span>
              <button type="button" className="rounded-[10px] bg-tide-deep px-3 py-1 font-semibold text-white" onClick={() => { seek(props.resumeAt); void video.current?.play().catch(() => {}); }}>
                Resume
              </button>
              <button type="button" className="rounded-[10px] border border-ink px-3 py-1" onClick={() => setResumeOffer(false)}>
                Start over
              </button>
            </p>
          )}
          <button type="button" className="rounded-[10px] border border-ink px-3 py-1 text-sm" onClick={() => setClockShown((s) => !s)} aria-pressed={clockShown}>
            {clockShown ? 'Hide clock' : 'Show clock'}
          </button>
          {props.captions && (
            <button type="button" className="rounded-[10px] border border-ink px-3 py-1 text-sm aria-pressed:bg-ink aria-pressed:text-paper" onClick={toggleCaptions} aria-pressed={captionsOn} data-testid="captions-toggle">
              <span aria-hidden="true" className="mr-1 rounded-sm border border-current px-0.5 text-xs font-bold">CC</span>
              Captions
            </button>
          )}
          <p className="text-sm text-ink-soft" data-testid="player-keys">Keys: space play/pause · ← → 10 s · N / P next or previous chapter · C clock{props.captions && ' · T captions'}</p>
        </div>
        {summary && (
          <section className="mt-4 rounded-[10px] border-l-4 border-mint bg-mint/10 p-4" role="status" aria-label="Class finished">
            <h2 className="text-xl">Class finished, well done!</h2>
            <p>
              You trained for <span className="font-bold tabular">{formatClock(summary.watchedSeconds)}</span>
              {summary.roundsDone > 0 && <> and completed <span className="font-bold">{summary.roundsDone}</span> round{summary.roundsDone === 1 ? '' : 's'}</>}.
              Drink some water and take it easy for a few minutes.
            </p>
            <button type="button" className="mt-2 text-sm underline" onClick={dismissSummary}>Close</button>
          </section>
        )}
      </div>
      <aside className="card max-h-[70vh] overflow-y-auto p-3">
        <h2 className="px-2 pb-2 text-lg">Chapters</h2>
        <ChapterList chapters={props.chapters} current={current} thumbnailBase={props.thumbnailBase} notes={notes} onJump={jump} />
      </aside>
    </div>
  );
}

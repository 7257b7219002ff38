import Hls from 'hls.js';

/**
 * Attaches the HLS playlist to the <video>: hls.js where the browser needs it, native HLS
 * otherwise. Resolves once the media can be handed to the waveform.
 */
export function attachHls(video: HTMLVideoElement | null, playlistUrl: string | null, onFatal: () => void): { ready: Promise<void>; destroy(): void } {
  let hls: Hls | null = null;
  const ready = new Promise<void>((resolve) => {
    if (!playlistUrl || !video) return resolve();
    if (Hls.isSupported()) {
      hls = new Hls({ maxBufferLength: 20 });
      hls.on(Hls.Events.ERROR, (_e, data) => {
        if (data.fatal) onFatal();
      });
      hls.once(Hls.Events.MEDIA_ATTACHED, () => {
        hls?.loadSource(playlistUrl);
        resolve();
      });
      hls.attachMedia(video);
    } else {
      if (video.canPlayType('application/vnd.apple.mpegurl')) video.src = playlistUrl;
      resolve();
    }
  });
  return { ready, destroy: () => hls?.destroy() };
}

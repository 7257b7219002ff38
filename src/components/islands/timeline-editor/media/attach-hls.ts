import type Hls from 'hls.js/light';

/**
 * Attaches the HLS playlist to the <video>: hls.js wherever Media Source Extensions exist (some
 * Chromium builds claim native HLS but refuse segments from another origin, where the store
 * serves them), the browser's own HLS otherwise. hls.js's light build is loaded on demand, as in
 * the member player, so the class page stays light until the editor needs it. Resolves once the
 * media can be handed to the waveform.
 */
export function attachHls(video: HTMLVideoElement | null, playlistUrl: string | null, onFatal: () => void): { ready: Promise<void>; destroy(): void } {
  let hls: Hls | null = null;
  let destroyed = false;
  const ready = new Promise<void>((resolve) => {
    if (!playlistUrl || !video) return resolve();
    void import('hls.js/light').then(({ default: HlsLight }) => {
      if (destroyed) return resolve();
      if (!HlsLight.isSupported()) {
        if (video.canPlayType('application/vnd.apple.mpegurl')) video.src = playlistUrl;
        return resolve();
      }
      const player = new HlsLight({ maxBufferLength: 20 });
      hls = player;
      player.on(HlsLight.Events.ERROR, (_e, data) => {
        if (data.fatal) onFatal();
      });
      player.once(HlsLight.Events.MEDIA_ATTACHED, () => {
        player.loadSource(playlistUrl);
        resolve();
      });
      player.attachMedia(video);
    });
  });
  return {
    ready,
    destroy: () => {
      destroyed = true;
      hls?.destroy();
    },
  };
}

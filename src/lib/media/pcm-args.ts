/**
 * ffmpeg arguments that decode a recording's first audio stream to mono 32-bit float PCM on
 * stdout, for the audio analysis (and the waveform peaks, computed from the same samples).
 */

/**
 * `-t` with the probed duration cuts the AAC end padding ffmpeg 5.1 decodes past the edit list
 * (see buildPeaksArgs), so event times and peaks match the video.
 */
export function buildMonoPcmArgs(options: { input: string; sampleRate: number; durationSeconds?: number }): string[] {
  const limit = options.durationSeconds !== undefined && options.durationSeconds > 0 ? ['-t', options.durationSeconds.toFixed(6)] : [];
  return [
    '-hide_banner', '-nostdin', '-loglevel', 'error',
    '-i', options.input,
    '-map', '0:a:0', '-vn',
    '-ac', '1', '-ar', String(options.sampleRate),
    ...limit,
    '-c:a', 'pcm_f32le', '-f', 'f32le',
    'pipe:1',
  ];
}

/** Arguments that turn raw mono float PCM (a generated soundtrack) into an AAC file, with an optional plain video. */
export function buildEncodeSoundtrackArgs(options: {
  input: string;
  sampleRate: number;
  output: string;
  /** Adds a small grey video of the same length (for upload and playback tests). */
  video?: { width: number; height: number; fps: number };
}): string[] {
  const audioIn = ['-f', 'f32le', '-ar', String(options.sampleRate), '-ac', '1', '-i', options.input];
  if (!options.video) {
    return ['-hide_banner', '-nostdin', '-loglevel', 'error', '-y', ...audioIn, '-c:a', 'aac', '-b:a', '96k', options.output];
  }
  const { width, height, fps } = options.video;
  return [
    '-hide_banner', '-nostdin', '-loglevel', 'error', '-y',
    ...audioIn,
    '-f', 'lavfi', '-i', `color=c=gray:s=${width}x${height}:r=${fps}`,
    '-map', '1:v', '-map', '0:a', '-shortest',
    '-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p',
    '-c:a', 'aac', '-b:a', '96k',
    '-movflags', '+faststart',
    options.output,
  ];
}

/**
 * Speech bursts and pauses from voice-band energy. A burst is voice-band power well above the
 * recent background (music, room, distant chatter), tones left out. Without recognising words,
 * a spoken count still shows as a run of short bursts about a second apart; the proposal looks
 * for that pattern.
 */
import { PAUSE_MIN_SECONDS, type AudioEvent } from './audio-events';
import { clamp01, round3 } from './detect-tonal';
import { FRAMES_PER_SECOND, type FrameFeatures } from './frame-features';
import { RunningPercentile } from './running-percentile';

/** How far above the background a frame must be to count as speech, dB (tuned on generated voices). */
const RISE_DB = 9;
const MIN_LEVEL_DB = -55;
/** Background = this percentile of the voice band over the window before the frame. */
const FLOOR_PERCENTILE = 0.2;
const FLOOR_WINDOW_SECONDS = 6;
/** Gaps inside a word (stop consonants) up to this long are bridged, seconds. */
const BRIDGE_SECONDS = 0.05;
const MIN_BURST_SECONDS = 0.08;

export function detectSpeechEvents(f: FrameFeatures, tonalMask: Uint8Array): AudioEvent[] {
  const floorOf = new RunningPercentile(-120, 0);
  const window = Math.round(FLOOR_WINDOW_SECONDS * FRAMES_PER_SECOND);
  const floors = new Float32Array(f.count);
  const active = new Uint8Array(f.count);
  for (let i = 0; i < f.count; i++) {
    const floor = floorOf.size === 0 ? -120 : floorOf.percentile(FLOOR_PERCENTILE);
    floors[i] = floor;
    const db = f.voiceDb[i] as number;
    active[i] = tonalMask[i] ? 0 : db >= MIN_LEVEL_DB && db - floor >= RISE_DB ? 1 : 0;
    floorOf.add(db);
    if (i - window >= 0) floorOf.remove(f.voiceDb[i - window] as number);
  }

  const bridge = Math.round(BRIDGE_SECONDS * FRAMES_PER_SECOND);
  const events: AudioEvent[] = [];
  let i = 0;
  let previousEnd = -1;
  while (i < f.count) {
    if (!active[i]) {
      i++;
      continue;
    }
    const first = i;
    let last = i;
    let j = i + 1;
    while (j < f.count && (active[j] || (j - last <= bridge && !tonalMask[j]))) {
      if (active[j]) last = j;
      j++;
    }
    i = last + 1;
    const seconds = (last + 1 - first) / FRAMES_PER_SECOND;
    if (seconds < MIN_BURST_SECONDS) continue;
    let rise = 0;
    for (let k = first; k <= last; k++) rise += (f.voiceDb[k] as number) - (floors[k] as number);
    rise /= last + 1 - first;
    const atSeconds = first / FRAMES_PER_SECOND;
    if (previousEnd >= 0 && atSeconds - previousEnd >= PAUSE_MIN_SECONDS) {
      events.push({ atSeconds: round3(previousEnd), kind: 'pause', strength: 1, durationSeconds: round3(atSeconds - previousEnd) });
    }
    events.push({ atSeconds: round3(atSeconds), kind: 'speech', strength: round3(clamp01((rise - RISE_DB) / 20 + 0.3)), durationSeconds: round3(seconds) });
    previousEnd = (last + 1) / FRAMES_PER_SECOND;
  }
  return events;
}

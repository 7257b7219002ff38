/**
 * Audio events: what the analysis hears in a recording, stored with it and used by "Mark it for
 * me" to place the plan's boundaries. Times are seconds from the start of the recording.
 */

/**
 * - `tone`: a steady narrow-band sound of 500 Hz–4 kHz (an interval timer's beep).
 * - `whistle`: a strong narrow band of 1.8–4.2 kHz whose pitch wobbles (a coach's whistle).
 * - `speech`: a burst of voice-band energy (a word or a few words run together).
 * - `pause`: a stretch of at least {@link PAUSE_MIN_SECONDS} without speech after speech.
 * - `energy-rise` / `energy-fall`: the broad level changes by several dB and stays (music starts/stops).
 */
export const AUDIO_EVENT_KINDS = ['tone', 'whistle', 'speech', 'pause', 'energy-rise', 'energy-fall'] as const;
export type AudioEventKind = (typeof AUDIO_EVENT_KINDS)[number];

/** Shortest silence between two speech bursts reported as a `pause`. */
export const PAUSE_MIN_SECONDS = 1.5;

export interface AudioEvent {
  atSeconds: number;
  kind: AudioEventKind;
  /** 0–1: how clearly the event stands out from its surroundings. */
  strength: number;
  durationSeconds: number;
  /** Pitch of a tone or whistle (mean over the event), Hz; absent for other kinds. */
  frequencyHz?: number;
}

/** Sorts by time, then kind, so stored and compared lists are stable. */
export function sortEvents(events: AudioEvent[]): AudioEvent[] {
  return events.sort((a, b) => a.atSeconds - b.atSeconds || (a.kind < b.kind ? -1 : a.kind > b.kind ? 1 : 0));
}

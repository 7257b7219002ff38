/**
 * The playhead time outside React state: the waveform updates it many times a second while
 * playing, and only the few small components that show it re-render.
 */
import { useSyncExternalStore } from 'react';

export interface PlayheadStore {
  get(): number;
  set(seconds: number): void;
  subscribe(listener: () => void): () => void;
  playing(): boolean;
  setPlaying(playing: boolean): void;
}

export function createPlayheadStore(): PlayheadStore {
  let time = 0;
  let isPlaying = false;
  const listeners = new Set<() => void>();
  const emit = () => listeners.forEach((l) => l());
  return {
    get: () => time,
    set(seconds) {
      if (seconds === time) return;
      time = seconds;
      emit();
    },
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    playing: () => isPlaying,
    setPlaying(p) {
      if (p === isPlaying) return;
      isPlaying = p;
      emit();
    },
  };
}

/** The playhead rounded to tenths, so a display re-renders at most ten times a second. */
export function usePlayheadTenths(store: PlayheadStore): number {
  return useSyncExternalStore(store.subscribe, () => Math.round(store.get() * 10) / 10, () => 0);
}

export function usePlaying(store: PlayheadStore): boolean {
  return useSyncExternalStore(store.subscribe, store.playing, () => false);
}

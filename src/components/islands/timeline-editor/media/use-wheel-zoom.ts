import { useEffect, type RefObject } from 'react';

/** Ctrl/⌘ + wheel zooms; a non-passive listener so the page does not zoom instead. */
export function useWheelZoom(target: RefObject<HTMLElement | null>, onStep: RefObject<(direction: 1 | -1) => void>) {
  useEffect(() => {
    const el = target.current;
    if (!el) return;
    const onWheel = (e: WheelEvent) => {
      if (!(e.ctrlKey || e.metaKey)) return;
      e.preventDefault();
      onStep.current?.(e.deltaY < 0 ? 1 : -1);
    };
    el.addEventListener('wheel', onWheel, { passive: false });
    return () => el.removeEventListener('wheel', onWheel);
  }, [target, onStep]);
}

import { useEffect, useRef } from 'react';

/** Whether Alt (Option) is held: it means "place freely", for drags as well as keys. */
export function useAltHeld() {
  const altHeld = useRef(false);
  useEffect(() => {
    const track = (e: KeyboardEvent | PointerEvent) => {
      altHeld.current = e.altKey;
    };
    window.addEventListener('keydown', track);
    window.addEventListener('keyup', track);
    window.addEventListener('pointerdown', track, true);
    window.addEventListener('pointermove', track, true);
    return () => {
      window.removeEventListener('keydown', track);
      window.removeEventListener('keyup', track);
      window.removeEventListener('pointerdown', track, true);
      window.removeEventListener('pointermove', track, true);
    };
  }, []);
  return altHeld;
}

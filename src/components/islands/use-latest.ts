import { useLayoutEffect, useRef, type RefObject } from 'react';

/**
 * A ref that always holds the latest committed `value`, for event handlers and long-lived
 * listeners that must not be re-created on every render. Updated after the commit, not during
 * render (React's rules: rendering never writes refs).
 */
export function useLatest<T>(value: T): RefObject<T> {
  const ref = useRef(value);
  useLayoutEffect(() => {
    ref.current = value;
  });
  return ref;
}

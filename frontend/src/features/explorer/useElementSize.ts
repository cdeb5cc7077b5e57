import { useLayoutEffect, useState, type RefObject } from 'react';

/**
 * The content size of an element, kept up to date with a ResizeObserver. The size is read in the observer's callback,
 * which runs after the browser's own layout, never in the commit: reading it there would force a layout of the whole
 * new page inside React's task (tens of milliseconds when the map page first mounts). The first render therefore
 * has size 0 × 0, and the real size follows before the first paint or one frame later.
 */
export function useElementSize(ref: RefObject<HTMLElement | null>): { width: number; height: number } {
  const [size, setSize] = useState({ width: 0, height: 0 });
  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    const update = () => setSize((s) => (s.width === el.clientWidth && s.height === el.clientHeight ? s : { width: el.clientWidth, height: el.clientHeight }));
    if (typeof ResizeObserver === 'undefined') {
      update(); // no observer (some test environments): measure once
      return;
    }
    const observer = new ResizeObserver(update);
    observer.observe(el);
    return () => observer.disconnect();
  }, [ref]);
  return size;
}

/**
 * The content width (CSS px) of an element, following resizes (ResizeObserver). Canvas plots use it to
 * draw at their real size instead of a fixed one. Returns `fallback` until the element is measured.
 */
import { useCallback, useEffect, useRef, useState } from 'react';

export function useElementWidth<T extends HTMLElement>(fallback: number): [(el: T | null) => void, number] {
  const [width, setWidth] = useState(fallback);
  const observer = useRef<ResizeObserver | null>(null);
  const ref = useCallback((el: T | null) => {
    observer.current?.disconnect();
    observer.current = null;
    if (!el || typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver((entries) => {
      const w = Math.floor(entries[0]?.contentRect.width ?? 0);
      // Whole pixels only, so sub-pixel jitter does not repaint the canvas.
      if (w > 0) setWidth((old) => (Math.abs(old - w) >= 1 ? w : old));
    });
    ro.observe(el);
    observer.current = ro;
  }, []);
  useEffect(() => () => observer.current?.disconnect(), []);
  return [ref, width];
}

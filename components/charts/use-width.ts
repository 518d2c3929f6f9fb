"use client";

import { useLayoutEffect, useRef, useState } from "react";

/**
 * The rendered width of an element, kept current with a ResizeObserver. The observer fires a
 * frame after a resize, so for that frame a chart is still drawn at its old width: give the
 * measured element `overflow-hidden`, or a window widened past a layout break (one column to
 * two) scrolls sideways for a moment.
 */
export function useWidth<T extends HTMLElement>(): [React.RefObject<T | null>, number] {
  const ref = useRef<T>(null);
  const [width, setWidth] = useState(0);
  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    setWidth(el.getBoundingClientRect().width);
    const ro = new ResizeObserver((entries) => setWidth(entries[0].contentRect.width));
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  return [ref, width];
}

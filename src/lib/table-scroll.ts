import { useEffect, useState, type RefObject } from 'react';

/**
 * Whether an element's content is wider than the element (a wide table in a narrow window), kept
 * current as either resizes. False until measured, so a page drawn on the server shows no hint.
 */
export function useSidewaysOverflow(ref: RefObject<HTMLElement | null>): boolean {
  const [overflow, setOverflow] = useState(false);
  useEffect(() => {
    const el = ref.current;
    if (!el || typeof ResizeObserver === 'undefined') return;
    // One pixel of slack: sub-pixel widths round differently in scrollWidth and clientWidth.
    const measure = () => setOverflow(el.scrollWidth > el.clientWidth + 1);
    measure();
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    if (el.firstElementChild) ro.observe(el.firstElementChild);
    return () => ro.disconnect();
  }, [ref]);
  return overflow;
}

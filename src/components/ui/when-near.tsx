import { useEffect, useRef, useState, type ReactNode } from 'react';

type Props = {
  children: ReactNode;
  /** Shown until the content is near the viewport; give it the content's rough height. Give it a focusable element so Tab can reach it. */
  placeholder: ReactNode;
  /** How far outside the viewport loading starts. */
  margin?: string;
};

const FIELDS = 'input:not([disabled]), select:not([disabled]), textarea:not([disabled])';
const FOCUSABLE = 'input:not([disabled]), select:not([disabled]), textarea:not([disabled]), button:not([disabled]), a[href]';

/**
 * Mounts its children only when they come near the viewport (or the page is printed, or a keyboard user
 * tabs into the placeholder), so code that only a card further down needs is not downloaded with the page.
 * Focus that arrived in the placeholder moves to the content's first control once it has loaded.
 */
export function WhenNear({ children, placeholder, margin = '600px 0px' }: Props) {
  const ref = useRef<HTMLDivElement>(null);
  const content = useRef<HTMLDivElement>(null);
  const [near, setNear] = useState(typeof IntersectionObserver === 'undefined');
  const [focusArrived, setFocusArrived] = useState(false);

  useEffect(() => {
    if (near || !ref.current) return;
    const show = () => setNear(true);
    const io = new IntersectionObserver((entries) => entries.some((e) => e.isIntersecting) && show(), { rootMargin: margin });
    io.observe(ref.current);
    // Moving to this card by anchor, find-in-page or printing should not find a placeholder.
    window.addEventListener('beforeprint', show);
    return () => {
      io.disconnect();
      window.removeEventListener('beforeprint', show);
    };
  }, [near, margin]);

  // The placeholder (and any loading fallback) held the focus; hand it to the first real control when it appears,
  // unless the reader has moved on meanwhile.
  useEffect(() => {
    if (!near || !focusArrived || !content.current) return;
    const box = content.current;
    const handOver = () => {
      // The first input the reader can change (the placeholder promised the inputs), else the first control at all.
      const inBox = (selector: string) => [...box.querySelectorAll<HTMLElement>(selector)].find((el) => !el.closest('[data-example-placeholder]'));
      const target = inBox(FIELDS) ?? inBox(FOCUSABLE);
      if (!target) return false;
      const current = document.activeElement;
      if (!current || current === document.body || box.contains(current)) target.focus();
      return true;
    };
    if (handOver()) return setFocusArrived(false);
    const observer = new MutationObserver(() => handOver() && (observer.disconnect(), setFocusArrived(false)));
    observer.observe(box, { childList: true, subtree: true });
    return () => observer.disconnect();
  }, [near, focusArrived]);

  if (near)
    return (
      <div
        ref={content}
        className="contents"
        // The content's own loading fallback can be the placeholder again (code still downloading): focus there counts too.
        onFocus={(e) => {
          if ((e.target as HTMLElement).closest('[data-example-placeholder]')) setFocusArrived(true);
        }}
      >
        {children}
      </div>
    );
  return (
    <div
      ref={ref}
      onFocus={() => {
        setFocusArrived(true);
        setNear(true);
      }}
    >
      {placeholder}
    </div>
  );
}

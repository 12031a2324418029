import { useEffect, useRef, useState, type ReactNode } from 'react';

type Props = {
  children: ReactNode;
  /** Shown until the content is near the viewport; give it the content's rough height. */
  placeholder: ReactNode;
  /** How far outside the viewport loading starts. */
  margin?: string;
};

/**
 * Mounts its children only when they come near the viewport (or the page is printed), so code that
 * only a card further down needs is not downloaded with the page.
 */
export function WhenNear({ children, placeholder, margin = '600px 0px' }: Props) {
  const ref = useRef<HTMLDivElement>(null);
  const [near, setNear] = useState(typeof IntersectionObserver === 'undefined');

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

  return near ? <>{children}</> : <div ref={ref}>{placeholder}</div>;
}

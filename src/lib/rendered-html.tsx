import { useLayoutEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { createPortal } from 'react-dom';

type Slot = { el: HTMLElement; body: string };

type Props = {
  /** Sanitized HTML from the server (see server/lib/markdown-html.ts). */
  html: string;
  /** Mounts the live card for each worked-example slot; without it the block stays as text. */
  renderWorkedExample?: (body: string, index: number) => ReactNode;
  className?: string;
};

/**
 * A body the server already rendered and sanitized with the same rules as <Markdown>: readers get
 * the text at first paint without the Markdown parser, and the live worked-example cards are mounted
 * into their slots afterwards.
 */
export function RenderedMarkdown({ html, renderWorkedExample, className = 'prose-notebook' }: Props) {
  const ref = useRef<HTMLDivElement>(null);
  const [slots, setSlots] = useState<Slot[]>([]);
  const inner = useMemo(() => ({ __html: html }), [html]);

  useLayoutEffect(() => {
    if (!renderWorkedExample || !ref.current) return setSlots([]);
    const found = [...ref.current.querySelectorAll<HTMLElement>('[data-example-slot]')].map((el) => {
      // The block's source text is only for readers without script; the card takes its place.
      el.dataset.source ??= el.querySelector('code')?.textContent ?? '';
      el.replaceChildren();
      return { el, body: el.dataset.source };
    });
    setSlots(found);
  }, [html, renderWorkedExample]);

  return (
    <>
      <div ref={ref} className={className} dangerouslySetInnerHTML={inner} />
      {renderWorkedExample && slots.map((s, i) => createPortal(renderWorkedExample(s.body, i), s.el, `example-${i}`))}
    </>
  );
}

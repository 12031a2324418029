import { snippetSegments } from '@shared/search';

/** A result snippet with its matched words marked, rendered as text nodes (never as HTML). */
export function HighlightedSnippet({ snippet, className = '' }: { snippet: string; className?: string }) {
  return (
    <p className={className}>
      {snippetSegments(snippet).map((s, i) =>
        s.hit ? (
          <mark key={i} className="rounded-sm bg-copper-wash px-0.5 font-semibold text-copper-dark">
            {s.text}
          </mark>
        ) : (
          <span key={i}>{s.text}</span>
        ),
      )}
    </p>
  );
}

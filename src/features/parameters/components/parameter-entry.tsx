import type { MouseEvent, ReactNode } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { CLASSES, SURFACES } from '@shared/constants';
import { Card, Chip } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { RenderedMarkdown } from '@/lib/rendered-html';
import type { ParameterPageData } from '../api/parameters';
import { CATEGORY_INFO, formatRange, formatStep, isChoice, splitAliases, unitName } from './parameter-format';

const CLASS_NAMES = new Map<string, string>(CLASSES.map((c) => [c.slug, c.name]));
const SURFACE_NAMES = new Map<string, string>(SURFACES.map((s) => [s.slug, s.name]));
const dateFmt = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });

type Props = {
  data: ParameterPageData;
  /** Renders a worked-example block; the page passes the calculator card (features do not import each other). */
  renderWorkedExample?: (body: string, index: number) => ReactNode;
};

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="min-w-0">
      <dt className="text-[0.7rem] font-semibold tracking-wider text-ink-muted uppercase">{label}</dt>
      <dd className="mt-0.5 font-mono text-[0.95rem] text-ink">{children}</dd>
    </div>
  );
}

/** A parameter entry as a reference page: header, key facts, the text with live examples, cautions, links. */
export function ParameterEntry({ data, renderWorkedExample }: Props) {
  const { parameter: p, revision } = data;
  const navigate = useNavigate();
  const { names, spellings } = splitAliases(p.name, p.aliases);
  const step = formatStep(p);
  const category = CATEGORY_INFO[p.category];

  // Links inside the Markdown are plain anchors; keep in-app ones in the single-page app.
  const handleArticleClick = (e: MouseEvent<HTMLElement>) => {
    if (e.defaultPrevented || e.button !== 0 || e.metaKey || e.ctrlKey || e.shiftKey || e.altKey) return;
    const a = (e.target as HTMLElement).closest('a');
    const href = a?.getAttribute('href');
    if (!a || !href || a.target === '_blank' || !href.startsWith('/')) return;
    e.preventDefault();
    navigate(href);
  };

  return (
    <article className="flex flex-col gap-6">
      <header className="border-b border-paper-line pb-5">
        <nav aria-label="Breadcrumb" className="text-sm">
          <Link to="/parameters">Parameter library</Link>
          <span className="px-1.5 text-ink-faint" aria-hidden>
            /
          </span>
          <Link to={`/parameters#category-${p.category}`}>{category.label}</Link>
        </nav>
        <h1 className="mt-2 font-serif text-3xl leading-tight font-bold text-ink sm:text-4xl">{p.name}</h1>
        {names.length > 0 && (
          <p className="mt-2 text-sm text-ink-soft">
            <span className="font-medium">Also called </span>
            {names.map((n, i) => (
              <span key={n}>
                {i > 0 && (i === names.length - 1 ? ' or ' : ', ')}
                <span className="italic">{n}</span>
              </span>
            ))}
            {spellings.length > 0 && <span className="text-ink-muted"> · also written {spellings.join(', ')}</span>}
          </p>
        )}
        <p className="mt-3 max-w-3xl font-serif text-lg leading-8 text-ink">{p.summary}</p>
      </header>

      <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_18rem]">
        <div className="min-w-0" onClick={handleArticleClick}>
          <Card className="mb-2 px-4 py-3">
            <dl className="grid grid-cols-2 gap-x-6 gap-y-3 sm:grid-cols-4">
              <Fact label="Typical range">{formatRange(p)}</Fact>
              {step && <Fact label="Step">{step}</Fact>}
              <Fact label="Unit">
                <span className="font-sans">{isChoice(p) ? 'a choice' : unitName(p.unit)}</span>
              </Fact>
              <Fact label="Category">
                <span className="font-sans">{category.label}</span>
              </Fact>
            </dl>
          </Card>
          <RenderedMarkdown html={p.bodyHtml} renderWorkedExample={renderWorkedExample} />
          {p.cautionsHtml && (
            <section aria-labelledby="cautions-heading" className="mt-8">
              <Notice
                tone="caution"
                title={
                  <span id="cautions-heading" className="text-base">
                    Cautions
                  </span>
                }
                className="px-5 py-4"
              >
                <RenderedMarkdown
                  html={p.cautionsHtml}
                  renderWorkedExample={renderWorkedExample}
                  className="font-serif text-[0.97rem] leading-7 text-ink [&_a]:font-medium [&_li]:my-1.5 [&_p]:my-2 [&_ul]:my-1 [&_ul]:list-disc [&_ul]:pl-5"
                />
              </Notice>
            </section>
          )}
        </div>

        <aside className="flex min-w-0 flex-col gap-6" aria-label="About this entry">
          {p.relatedParameters.length > 0 && (
            <section aria-labelledby="related-heading">
              <h2 id="related-heading" className="mb-2 text-xs font-semibold tracking-wider text-ink-muted uppercase">
                Related settings
              </h2>
              <ul className="flex flex-col divide-y divide-paper-line rounded-lg border border-paper-line bg-paper-card">
                {p.relatedParameters.map((r) => (
                  <li key={r.slug} className="px-3 py-2">
                    <Link to={`/parameters/${r.slug}`} className="text-sm font-semibold">
                      {r.name}
                    </Link>
                    <p className="line-clamp-2 text-xs leading-5 text-ink-muted">{r.summary}</p>
                  </li>
                ))}
              </ul>
            </section>
          )}
          <section aria-labelledby="guides-heading">
            <h2 id="guides-heading" className="mb-2 text-xs font-semibold tracking-wider text-ink-muted uppercase">
              Guides that discuss it
            </h2>
            {p.guides.length === 0 ? (
              <p className="text-sm text-ink-muted">No published guide covers this setting yet.</p>
            ) : (
              <ul className="flex flex-col gap-2" data-testid="parameter-guides">
                {p.guides.map((g) => (
                  <li key={g.slug}>
                    <Link to={`/guides/${g.slug}`} className="text-sm font-semibold leading-5">
                      {g.title}
                    </Link>
                    <div className="mt-1 flex flex-wrap gap-1">
                      <Chip>{CLASS_NAMES.get(g.class) ?? g.class}</Chip>
                      <Chip>{SURFACE_NAMES.get(g.surface) ?? g.surface}</Chip>
                    </div>
                  </li>
                ))}
              </ul>
            )}
          </section>
          {p.calculator && (
            <p className="text-sm">
              <Link to={`/calculators/${p.calculator}`}>Open the calculator for this setting →</Link>
            </p>
          )}
          <p className="border-t border-paper-line pt-3 text-xs leading-5 text-ink-muted">
            Live version {revision.number}
            {revision.publishedAt && <> · published {dateFmt.format(new Date(revision.publishedAt))}</>} · by {revision.author.displayName}. Every change to
            this entry is reviewed by a moderator before it goes live.
          </p>
        </aside>
      </div>
    </article>
  );
}

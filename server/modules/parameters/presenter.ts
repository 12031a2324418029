import { splitCautions } from '../../../shared/markdown/cautions';
import { resolveParameterHref } from '../../../shared/markdown/links';
import { renderMarkdownHtml } from '../../lib/markdown-html';
import type { ParameterDetail, ParameterGuideRef, ParameterLiveRevision, ParameterSummary } from '../../../shared/schemas/parameter';
import type { LiveParameter } from './service';

export function presentParameterSummary(p: LiveParameter): ParameterSummary {
  const c = p.content;
  return {
    slug: p.slug,
    name: c.name,
    aliases: c.aliases,
    category: c.category,
    unit: c.unit,
    range: { min: c.range.min, max: c.range.max, step: c.range.step },
    summary: c.summary,
  };
}

export function presentParameterDetail(
  p: LiveParameter,
  relatedParameters: ParameterDetail['relatedParameters'],
  guides: ParameterGuideRef[],
): ParameterDetail {
  const { main, cautions } = splitCautions(p.content.body);
  const opts = { resolveHref: resolveParameterHref, hiddenImages: new Set(p.revision.hiddenImages) };
  return {
    ...presentParameterSummary(p),
    body: p.content.body,
    bodyHtml: renderMarkdownHtml(main, opts),
    cautionsHtml: cautions === null ? null : renderMarkdownHtml(cautions, opts),
    related: p.content.related,
    relatedParameters,
    calculator: p.content.calculator,
    guides,
  };
}

export function presentLiveRevision(p: LiveParameter): ParameterLiveRevision {
  return {
    id: p.revision.id,
    number: p.revision.number,
    publishedAt: p.revision.publishedAt ? new Date(p.revision.publishedAt).toISOString() : null,
    author: { id: p.revision.authorId, displayName: p.revision.authorName },
  };
}

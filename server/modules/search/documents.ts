import type { DataSource } from 'typeorm';
import type { DocumentKind } from '../../../shared/constants';
import { CLASSES, SURFACES } from '../../../shared/constants';
import type { GuideContent } from '../../../shared/schemas/guide';
import type { ParameterContent } from '../../../shared/schemas/parameter';
import { markdownToText, stripMarkup } from './markdown-text';
import { setupSettings, setupText } from './setup-text';
import type { SearchDocument } from './types';

const CLASS_SLUGS = new Set<string>(CLASSES.map((c) => c.slug));
const SURFACE_SLUGS = new Set<string>(SURFACES.map((s) => s.slug));

/** URLs of the pages a hit opens. */
export const searchUrls = {
  parameter: (slug: string) => `/parameters/${slug}`,
  guide: (slug: string) => `/guides/${slug}`,
  setup: (slug: string) => `/guides/${slug}#setup`,
};

/** The search item of a live parameter revision. */
export function parameterDocument(slug: string, c: ParameterContent): SearchDocument {
  return {
    type: 'parameter',
    slug,
    title: c.name,
    url: searchUrls.parameter(slug),
    aliases: c.aliases ?? [],
    summary: stripMarkup(c.summary),
    body: markdownToText(c.body ?? ''),
    tags: [c.category, c.unit].filter(Boolean),
    class: null,
    surface: null,
    parameters: [slug],
  };
}

/** The search item of a live guide revision. */
export function guideDocument(slug: string, c: GuideContent): SearchDocument {
  return {
    type: 'guide',
    slug,
    title: c.title,
    url: searchUrls.guide(slug),
    aliases: [],
    summary: stripMarkup([c.summary, c.conditions].filter(Boolean).join(' ')),
    body: markdownToText(c.body ?? ''),
    tags: c.tags ?? [],
    class: c.class,
    surface: c.surface,
    parameters: c.parameters ?? [],
  };
}

/**
 * The search item of a live guide's baseline setup record. The record's exact shape belongs to the
 * setup module; here it is written in words (setup-text.ts), and its class, surface and the
 * parameter slugs it sets are read where present.
 */
export function setupDocument(slug: string, guide: GuideContent, setup: Record<string, unknown>): SearchDocument {
  const vehicle = (setup.vehicle ?? {}) as Record<string, unknown>;
  const cls = [setup.class, vehicle.class].find((v): v is string => typeof v === 'string' && CLASS_SLUGS.has(v)) ?? guide.class;
  const surface =
    [setup.surface, (setup.conditions as Record<string, unknown> | undefined)?.surface].find(
      (v): v is string => typeof v === 'string' && SURFACE_SLUGS.has(v),
    ) ?? guide.surface;
  const settings = setupSettings(setup);
  const params = settings ? Object.keys(settings).filter((k) => /^[a-z0-9]+(-[a-z0-9]+)*$/.test(k)) : [];
  const { headline, rest } = setupText(setup);
  return {
    type: 'setup',
    slug,
    title: `Baseline setup: ${guide.title}`,
    url: searchUrls.setup(slug),
    aliases: [],
    // The headline in words is what a snippet shows first ("17.5T sensored, 2S LiPo, 84/32 × 2.6, drag brake 8 %").
    summary: headline || stripMarkup(guide.summary),
    body: rest,
    tags: ['setup', 'baseline', ...(guide.tags ?? [])],
    class: cls,
    surface,
    parameters: params.length ? params : (guide.parameters ?? []),
  };
}

type LiveRow = { kind: DocumentKind; slug: string; content: Record<string, unknown>; setup: Record<string, unknown> | null };

function toDocuments(row: LiveRow): SearchDocument[] {
  if (row.kind === 'parameter') return [parameterDocument(row.slug, row.content as unknown as ParameterContent)];
  const guide = row.content as unknown as GuideContent;
  const out = [guideDocument(row.slug, guide)];
  if (row.setup && typeof row.setup === 'object') out.push(setupDocument(row.slug, guide, row.setup));
  return out;
}

// Only the live revision of a visible document: drafts, proposals, returned and archived revisions never qualify.
const LIVE_SQL = `SELECT d.kind, d.slug, r.content, r.setup
  FROM documents d JOIN revisions r ON r.id = d.published_revision_id AND r.document_id = d.id AND r.state = 'published'
  WHERE d.hidden_at IS NULL`;

/** Every live item, read from PostgreSQL. */
export async function loadLiveDocuments(ds: DataSource): Promise<SearchDocument[]> {
  const rows: LiveRow[] = await ds.query(LIVE_SQL);
  return rows.flatMap(toDocuments);
}

/** The live items of one document (none when it is hidden or has no live revision). */
export async function loadLiveDocument(ds: DataSource, kind: DocumentKind, slug: string): Promise<SearchDocument[]> {
  const rows: LiveRow[] = await ds.query(`${LIVE_SQL} AND d.kind = $1 AND d.slug = $2`, [kind, slug]);
  return rows.flatMap(toDocuments);
}

import { PARAMETER_CATEGORIES } from '../../../shared/constants';
import { parameterContentSchema, type ParameterContent } from '../../../shared/schemas/parameter';
import { notFound } from '../../lib/errors';
import type { AppContext } from '../../context';

/** A live parameter: its document slug, the live revision's content and who wrote that revision. */
export type LiveParameter = {
  slug: string;
  content: ParameterContent;
  revision: { id: string; number: number; publishedAt: Date | null; authorId: string; authorName: string; hiddenImages: string[] };
};

type LiveRow = {
  slug: string;
  content: unknown;
  revision_id: string;
  number: number;
  published_at: Date | null;
  author_id: string;
  author_name: string;
  hidden_images: string[];
};

const LIVE_SQL = `
  SELECT d.slug, r.content, r.id AS revision_id, r.number, r.published_at, u.id AS author_id, u.display_name AS author_name,
         ARRAY(SELECT ri.image_id::text FROM revision_images ri JOIN images i ON i.id = ri.image_id
                WHERE ri.revision_id = r.id AND i.hidden_at IS NOT NULL ORDER BY ri.image_id) AS hidden_images
    FROM documents d
    JOIN revisions r ON r.id = d.published_revision_id
    JOIN users u ON u.id = r.author_id
   WHERE d.kind = 'parameter' AND d.hidden_at IS NULL`;

function toLive(row: LiveRow): LiveParameter {
  // Content was validated on the way in; parsing again fills schema defaults for older rows.
  return {
    slug: row.slug,
    content: parameterContentSchema.parse(row.content),
    revision: {
      id: row.revision_id,
      number: row.number,
      publishedAt: row.published_at,
      authorId: row.author_id,
      authorName: row.author_name,
      hiddenImages: row.hidden_images ?? [],
    },
  };
}

const categoryRank = (c: string) => PARAMETER_CATEGORIES.indexOf(c as (typeof PARAMETER_CATEGORIES)[number]);

export function parametersService(ctx: AppContext) {
  const ds = ctx.dataSource;
  return {
    /** Live, visible entries in the library's order: category (our fixed order), then name. */
    async listLive(): Promise<LiveParameter[]> {
      const rows: LiveRow[] = await ds.query(LIVE_SQL);
      return rows
        .map(toLive)
        .sort(
          (a, b) =>
            categoryRank(a.content.category) - categoryRank(b.content.category) || a.content.name.localeCompare(b.content.name, 'en', { sensitivity: 'base' }),
        );
    },

    /** One live entry with the live entries it relates to and the published guides that discuss it. */
    async getLive(slug: string) {
      const [row]: LiveRow[] = await ds.query(`${LIVE_SQL} AND d.slug = $1`, [slug]);
      if (!row) throw notFound('That parameter');
      const parameter = toLive(row);
      const related = parameter.content.related.length
        ? ((await ds.query(`${LIVE_SQL} AND d.slug = ANY($1::text[])`, [parameter.content.related])) as LiveRow[]).map(toLive)
        : [];
      const bySlug = new Map(related.map((p) => [p.slug, p]));
      const relatedParameters = parameter.content.related.flatMap((s) => {
        const p = bySlug.get(s);
        return p ? [{ slug: p.slug, name: p.content.name, summary: p.content.summary }] : [];
      });
      // Guides list the parameters they discuss in content.parameters (jsonb array of slugs).
      const guides: { slug: string; title: string; class: string; surface: string }[] = await ds.query(
        `SELECT d.slug, r.content->>'title' AS title, r.content->>'class' AS class, r.content->>'surface' AS surface
           FROM documents d
           JOIN revisions r ON r.id = d.published_revision_id
          WHERE d.kind = 'guide' AND d.hidden_at IS NULL
            AND r.content->'parameters' @> jsonb_build_array($1::text)
          ORDER BY r.content->>'title'`,
        [slug],
      );
      return { parameter, relatedParameters, guides };
    },
  };
}

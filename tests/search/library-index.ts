import { readGuideDirs, readParameterFiles } from '../../server/db/seed-content';
import { guideDocument, parameterDocument } from '../../server/modules/search/documents';
import { SearchIndex, type SearchDocument } from '../../server/modules/search/search-index';

/** The live library as the seeder would publish it (last published revision of each guide), read from content/. */
export function libraryDocuments(): SearchDocument[] {
  const params = readParameterFiles().map((p) => parameterDocument(p.slug, p.content));
  const guides = readGuideDirs().flatMap((g) => {
    const live = [...g.revisions].reverse().find((r) => r.state === 'published');
    return live ? [guideDocument(g.slug, live.content)] : [];
  });
  return [...params, ...guides];
}

/** An index over the real library, without a database (quality and bench runs). */
export function libraryIndex() {
  const index = new SearchIndex();
  index.load(libraryDocuments());
  return index;
}

import type { SearchFacets, SearchHit, SearchType } from '../../../shared/schemas/search';

/** One searchable item: a live parameter entry, a live guide, or a live guide's baseline setup. */
export type SearchDocument = {
  type: SearchType;
  slug: string;
  title: string;
  url: string;
  aliases: string[];
  summary: string;
  /** Plain text (Markdown already stripped). */
  body: string;
  tags: string[];
  class: string | null;
  surface: string | null;
  /** Parameter slugs the item is about (a parameter lists itself). */
  parameters: string[];
};

export type SearchFilters = { type?: SearchType; class?: string; surface?: string; parameter?: string };

export type IndexSearchResult = { hits: SearchHit[]; facets: SearchFacets; total: number; didYouMean?: string; searchedFor?: string };

export const docId = (type: SearchType, slug: string) => `${type}:${slug}`;
export const paramWords = (slug: string) => slug.replace(/-/g, ' ');

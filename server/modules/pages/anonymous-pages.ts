/**
 * Finished pages for visitors (everyone without a session gets the same page), kept per URL while the
 * reads they were drawn from are the very objects the read cache still holds (identity says "current").
 */
export function anonymousPages(max = 500) {
  const pages = new Map<string, { reads: object[]; html: string }>();
  return {
    get(url: string, reads: object[]) {
      const hit = pages.get(url);
      return hit && hit.reads.length === reads.length && hit.reads.every((r, i) => r === reads[i]) ? hit.html : undefined;
    },
    set(url: string, reads: object[], html: string) {
      if (!pages.has(url) && pages.size >= max) pages.delete(pages.keys().next().value as string);
      pages.set(url, { reads, html });
    },
  };
}

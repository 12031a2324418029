import zlib from 'node:zlib';

/**
 * A page ready to send. A finished page kept for visitors also carries its brotli and gzip forms, made
 * once in the background at the highest levels, so a cached page costs no compression per request.
 */
export type DrawnPage = { html: string; br?: Buffer; gzip?: Buffer };

/**
 * Finished pages for visitors (everyone without a session gets the same page), kept per URL while the
 * reads they were drawn from are the very objects the read cache still holds (identity says "current").
 */
export function anonymousPages(max = 500) {
  const pages = new Map<string, { reads: object[]; page: DrawnPage }>();
  return {
    get(url: string, reads: object[]): DrawnPage | undefined {
      const hit = pages.get(url);
      return hit && hit.reads.length === reads.length && hit.reads.every((r, i) => r === reads[i]) ? hit.page : undefined;
    },
    set(url: string, reads: object[], html: string): DrawnPage {
      if (!pages.has(url) && pages.size >= max) pages.delete(pages.keys().next().value as string);
      const page: DrawnPage = { html };
      pages.set(url, { reads, page });
      compressInBackground(page);
      return page;
    },
  };
}

/** Fills in the page's compressed forms; until they are there the page is compressed per request as any other answer. */
function compressInBackground(page: DrawnPage) {
  const input = Buffer.from(page.html, 'utf8');
  zlib.brotliCompress(
    input,
    { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: zlib.constants.BROTLI_MAX_QUALITY, [zlib.constants.BROTLI_PARAM_SIZE_HINT]: input.length } },
    (err, out) => {
      if (!err) page.br = out;
    },
  );
  zlib.gzip(input, { level: zlib.constants.Z_BEST_COMPRESSION }, (err, out) => {
    if (!err) page.gzip = out;
  });
}

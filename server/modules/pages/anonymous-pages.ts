import zlib from 'node:zlib';

/**
 * A page ready to send. A finished page kept for visitors also carries its brotli and gzip forms, made
 * once in the background when the page is first served again from the cache, so a page read over and
 * over costs no compression per request.
 */
export type DrawnPage = { html: string; br?: Buffer; gzip?: Buffer; compressing?: boolean };

/**
 * Finished pages for visitors (everyone without a session gets the same page), kept per URL while the
 * reads they were drawn from are the very objects the read cache still holds (identity says "current").
 */
export function anonymousPages(max = 500) {
  const pages = new Map<string, { reads: object[]; page: DrawnPage }>();
  return {
    get(url: string, reads: object[]): DrawnPage | undefined {
      const hit = pages.get(url);
      if (!hit || hit.reads.length !== reads.length || !hit.reads.every((r, i) => r === reads[i])) return undefined;
      // Only a page asked for twice before it changed earns its stored compressed forms: under a stream of
      // changes (writers publishing) a page drawn once and dropped again costs no extra compression.
      if (!hit.page.compressing) compressInBackground(hit.page);
      return hit.page;
    },
    set(url: string, reads: object[], html: string): DrawnPage {
      if (!pages.has(url) && pages.size >= max) pages.delete(pages.keys().next().value as string);
      const page: DrawnPage = { html };
      pages.set(url, { reads, page });
      return page;
    },
  };
}

/**
 * Fills in the page's compressed forms, off the event loop (zlib's thread pool); until they are there the
 * page is compressed per request as any other answer. Brotli 6 and gzip 6: a few milliseconds for a page,
 * within a few per cent of the highest levels on HTML, which cost ten to fifty times as much CPU (quality 11
 * on every redraw took the load test's guide page from 40 to 1 request/s while writers kept changing content).
 */
function compressInBackground(page: DrawnPage) {
  page.compressing = true;
  const input = Buffer.from(page.html, 'utf8');
  zlib.brotliCompress(input, { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 6, [zlib.constants.BROTLI_PARAM_SIZE_HINT]: input.length } }, (err, out) => {
    if (!err) page.br = out;
  });
  zlib.gzip(input, { level: 6 }, (err, out) => {
    if (!err) page.gzip = out;
  });
}

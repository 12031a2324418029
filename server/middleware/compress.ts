import compression from 'compression';
import express, { type RequestHandler } from 'express';
import expressStaticGzip from 'express-static-gzip';
import zlib from 'node:zlib';

/**
 * Compresses dynamic answers worth it (HTML pages, JSON over 1 KB) with the encoding the browser asks
 * for (RFC 9110 §12.5.3; `Vary: Accept-Encoding` is set): brotli at quality 4 or gzip at level 6, both
 * fast enough per request. Files served already compressed (the build's .br/.gz copies) and byte-range
 * answers are left as they are.
 */
export function compressAnswers(): RequestHandler {
  return compression({
    threshold: 1024,
    level: 6,
    brotli: { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 4 } },
    filter: (req, res) => !req.headers.range && compression.filter(req, res),
  });
}

/**
 * Static files of the build, sent as the precompressed .br or .gz copy the build wrote beside them when
 * the browser accepts it (brotli first). A byte-range request gets the plain file, so ranges count bytes
 * of the file itself.
 */
type StaticOptions = { index: false; maxAge: string; immutable?: boolean };

export function staticBuild(dir: string, opts: StaticOptions): RequestHandler {
  const plain = express.static(dir, opts);
  const encoded = expressStaticGzip(dir, { enableBrotli: true, orderPreference: ['br', 'gz'], index: false, serveStatic: opts });
  return (req, res, next) => (req.headers.range ? plain(req, res, next) : encoded(req, res, next));
}

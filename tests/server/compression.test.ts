import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/test-app';
import { seedParameters } from '../../server/db/seed-content';

let t: TestApp;
let server: http.Server;
beforeAll(async () => {
  // npm test builds dist/ (with its .br and .gz copies) before the suites.
  t = await createTestApp({}, { catcher: false, serveClient: true });
  await seedParameters(t.db.dataSource);
  server = t.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
});
afterAll(async () => {
  server.close();
  await t.close();
});

/** The largest script of the build: the one whose size matters most on a phone. */
function largestScript() {
  const dir = path.resolve('dist', 'assets');
  const [file] = fs
    .readdirSync(dir)
    .filter((f) => f.endsWith('.js'))
    .sort((a, b) => fs.statSync(path.join(dir, b)).size - fs.statSync(path.join(dir, a)).size);
  return { url: `/assets/${file}`, raw: fs.readFileSync(path.join(dir, file)) };
}

/** The answer's bytes exactly as sent over the wire (no client decoding them on the way). */
function rawGet(url: string, headers: Record<string, string>): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }> {
  const { port } = server.address() as AddressInfo;
  return new Promise((resolve, reject) => {
    http
      .get({ host: '127.0.0.1', port, path: url, headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
      })
      .on('error', reject);
  });
}

describe('compression negotiated per request (RFC 9110 §12.5.3)', () => {
  it('sends a build script as brotli, gzip or plain, as the browser asks, with Vary', async () => {
    const { url, raw } = largestScript();
    const br = await rawGet(url, { 'Accept-Encoding': 'gzip, deflate, br' });
    expect(br.status).toBe(200);
    expect(br.headers['content-encoding']).toBe('br');
    expect(br.headers['vary']).toMatch(/Accept-Encoding/i);
    expect(br.headers['content-type']).toMatch(/javascript/);
    expect(br.headers['cache-control']).toMatch(/immutable/);
    expect(zlib.brotliDecompressSync(br.body).equals(raw)).toBe(true);
    expect(br.body.length).toBeLessThan(raw.length / 2.5);

    const gz = await rawGet(url, { 'Accept-Encoding': 'gzip' });
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(gz.body).equals(raw)).toBe(true);

    const plain = await rawGet(url, { 'Accept-Encoding': 'identity' });
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.equals(raw)).toBe(true);
  });

  it('answers a byte range with the plain file, never compressed', async () => {
    const { url, raw } = largestScript();
    const res = await rawGet(url, { 'Accept-Encoding': 'br, gzip', Range: 'bytes=0-99' });
    expect(res.status).toBe(206);
    expect(res.headers['content-encoding']).toBeUndefined();
    expect(res.body.equals(raw.subarray(0, 100))).toBe(true);
  });

  it('compresses JSON answers and drawn pages worth it, and leaves small ones alone', async () => {
    const list = await rawGet('/api/parameters', { 'Accept-Encoding': 'br' });
    expect(list.headers['content-encoding']).toBe('br');
    expect(list.headers['vary']).toMatch(/Accept-Encoding/i);
    const decoded = JSON.parse(zlib.brotliDecompressSync(list.body).toString('utf8'));
    expect(decoded.data.length).toBeGreaterThan(10);

    const page = await rawGet('/parameters/drag-brake', { 'Accept-Encoding': 'gzip' });
    expect(page.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(page.body).toString('utf8')).toContain('<h1');

    const none = await rawGet('/api/parameters', {});
    expect(none.headers['content-encoding']).toBeUndefined();

    const small = await rawGet('/api/health', { 'Accept-Encoding': 'br, gzip' });
    expect(small.headers['content-encoding']).toBeUndefined();
  });
});

describe("visitors' cached pages", () => {
  it('are sent from their stored brotli and gzip forms (a fixed length, no per-request compression), same page, same ETag', async () => {
    const plain = await rawGet('/parameters', {});
    expect(plain.status).toBe(200);
    const html = plain.body.toString('utf8');
    expect(html).toContain('<h1');
    // The stored forms are made in the background after the first drawing; then every answer is the same bytes.
    await expect.poll(async () => (await rawGet('/parameters', { 'Accept-Encoding': 'br' })).headers['content-length'], { timeout: 10_000 }).toBeTruthy();
    const br = await rawGet('/parameters', { 'Accept-Encoding': 'gzip, br' });
    expect(br.headers['content-encoding']).toBe('br');
    expect(br.headers['vary']).toMatch(/Accept-Encoding/i);
    expect(br.headers['content-type']).toMatch(/html/);
    expect(Number(br.headers['content-length'])).toBe(br.body.length);
    expect(zlib.brotliDecompressSync(br.body).toString('utf8')).toBe(html);
    expect((await rawGet('/parameters', { 'Accept-Encoding': 'br' })).body.equals(br.body)).toBe(true);
    await expect.poll(async () => (await rawGet('/parameters', { 'Accept-Encoding': 'gzip' })).headers['content-length'], { timeout: 10_000 }).toBeTruthy();
    const gz = await rawGet('/parameters', { 'Accept-Encoding': 'gzip' });
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(gz.body).toString('utf8')).toBe(html);
    const none = await rawGet('/parameters', { 'Accept-Encoding': 'identity' });
    expect(none.headers['content-encoding']).toBeUndefined();
    expect(none.body.toString('utf8')).toBe(html);
    expect(new Set([plain.headers.etag, br.headers.etag, gz.headers.etag, none.headers.etag]).size).toBe(1);
    const again = await rawGet('/parameters', { 'Accept-Encoding': 'br', 'If-None-Match': br.headers.etag! });
    expect(again.status).toBe(304);
  });
});

describe('conditional requests', () => {
  it('answers 304 Not Modified to a public GET whose ETag matches, and 200 once it changed', async () => {
    for (const url of ['/api/parameters', '/parameters/drag-brake', '/api/parameters/drag-brake', '/parameters', '/search?q=brake']) {
      const first = await rawGet(url, { 'Accept-Encoding': 'br' });
      expect(first.status, url).toBe(200);
      const etag = first.headers.etag;
      expect(etag, url).toBeTruthy();
      const again = await rawGet(url, { 'Accept-Encoding': 'br', 'If-None-Match': etag! });
      expect(again.status, url).toBe(304);
      expect(again.body.length, url).toBe(0);
      const stale = await rawGet(url, { 'Accept-Encoding': 'br', 'If-None-Match': 'W/"not-this-one"' });
      expect(stale.status, url).toBe(200);
    }
  });
});

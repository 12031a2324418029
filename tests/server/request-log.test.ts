import { Writable } from 'node:stream';
import express from 'express';
import pino from 'pino';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { requestLog } from '../../server/middleware/request-log';

function appWithLog() {
  const lines: Record<string, unknown>[] = [];
  const sink = new Writable({
    write(chunk, _enc, done) {
      for (const line of String(chunk).split('\n').filter(Boolean)) lines.push(JSON.parse(line));
      done();
    },
  });
  const app = express();
  app.use(requestLog(pino({ level: 'info' }, sink)));
  app.use((req, _res, next) => {
    (req as unknown as { user: { id: string } }).user = { id: 'member-42' };
    next();
  });
  app.get('/api/guides/:slug', (_req, res) => void res.json({ data: 'ok' }));
  app.get('/assets/app.js', (_req, res) => void res.type('js').send('x'));
  return { app, lines };
}

describe('request log', () => {
  it('writes one line per request with method, path, status, time, request id and user id, and nothing else of the request', async () => {
    const { app, lines } = appWithLog();
    const res = await request(app).get('/api/guides/stock-buggy?q=secret-word').set('Cookie', 'tw.sid=s%3Asecret').set('x-csrf-token', 'token-value');
    expect(res.status).toBe(200);
    await new Promise((r) => setTimeout(r, 20));
    expect(lines).toHaveLength(1);
    const [line] = lines;
    expect(line.msg).toMatch(/^GET \/api\/guides\/stock-buggy 200 \d+ ms$/);
    expect(line.req).toEqual({ id: res.headers['x-request-id'], method: 'GET', path: '/api/guides/stock-buggy' });
    expect(line.res).toEqual({ status: 200 });
    expect(line.userId).toBe('member-42');
    expect(typeof line.responseTime).toBe('number');
    const text = JSON.stringify(line);
    for (const secret of ['secret-word', 'tw.sid', 'token-value', 'user-agent', 'headers']) expect(text).not.toContain(secret);
  });

  it('keeps a request id given by a proxy in front, refuses odd ones, and skips build assets', async () => {
    const { app, lines } = appWithLog();
    const kept = await request(app).get('/api/guides/a').set('x-request-id', 'lb-1234567890');
    expect(kept.headers['x-request-id']).toBe('lb-1234567890');
    const odd = await request(app).get('/api/guides/b').set('x-request-id', 'short<script>');
    expect(odd.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
    await request(app).get('/assets/app.js');
    await new Promise((r) => setTimeout(r, 20));
    expect(lines.map((l) => (l.req as { path: string }).path)).toEqual(['/api/guides/a', '/api/guides/b']);
  });
});

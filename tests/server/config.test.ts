import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { assertServeable, DEV_SESSION_SECRET, loadConfig } from '../../server/config/env';
import { createTestApp } from '../setup/test-app';

const BASE = { DATABASE_URL: 'postgres://nobody@127.0.0.1:1/none' };

describe('development helpers fail closed', () => {
  it('are off unless DEV_TOOLS=true, in every NODE_ENV', () => {
    for (const NODE_ENV of ['development', 'test', 'production'] as const) {
      expect(loadConfig({ ...BASE, NODE_ENV, SESSION_SECRET: 'a-real-secret-of-some-length' }).devTools, NODE_ENV).toBe(false);
    }
    expect(loadConfig({ ...BASE, NODE_ENV: 'development', DEV_TOOLS: 'true' }).devTools).toBe(true);
  });

  it('refuse to serve with the built-in development secret unless they are on', () => {
    for (const NODE_ENV of ['development', 'test'] as const) {
      const config = loadConfig({ ...BASE, NODE_ENV });
      expect(config.sessionSecret).toBe(DEV_SESSION_SECRET);
      expect(() => assertServeable(config), NODE_ENV).toThrow(/SESSION_SECRET/);
      expect(() => assertServeable(loadConfig({ ...BASE, NODE_ENV, SESSION_SECRET: DEV_SESSION_SECRET })), `${NODE_ENV}, secret given`).toThrow(
        /SESSION_SECRET/,
      );
    }
    expect(() => assertServeable(loadConfig({ ...BASE, DEV_TOOLS: 'true' }))).not.toThrow();
    expect(() => assertServeable(loadConfig({ ...BASE, SESSION_SECRET: 'a-real-secret-of-some-length' }))).not.toThrow();
  });

  it('can never be on in production', () => {
    expect(() => loadConfig({ ...BASE, NODE_ENV: 'production', SESSION_SECRET: 'a-real-secret-of-some-length', DEV_TOOLS: 'true' })).toThrow(/DEV_TOOLS/);
    expect(() => loadConfig({ ...BASE, NODE_ENV: 'production' })).toThrow(/SESSION_SECRET/);
  });

  it('GET /api/dev/mail and its OpenAPI entry exist only when they are on', async () => {
    const off = await createTestApp({ DEV_TOOLS: 'false', SESSION_SECRET: 'a-real-secret-of-some-length' }, { catcher: false });
    try {
      const res = await request(off.app).get('/api/dev/mail');
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      const doc = (await request(off.app).get('/api/openapi.json').expect(200)).body;
      expect(Object.keys(doc.paths).filter((p) => p.startsWith('/api/dev'))).toEqual([]);
    } finally {
      await off.close();
    }
    const on = await createTestApp({}, { catcher: false });
    try {
      expect((await request(on.app).get('/api/dev/mail')).status).toBe(200);
    } finally {
      await on.close();
    }
  });
});

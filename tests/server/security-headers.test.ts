import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { createTestApp, type TestApp } from '../setup/test-app';
import { createUser } from '../factories/user';

// The production configuration, as `NODE_ENV=production npm start` builds it, behind a TLS-terminating
// proxy (TRUST_PROXY=true, X-Forwarded-Proto: https). The development headers are in health.test.ts.
let t: TestApp;
const https = { 'X-Forwarded-Proto': 'https' };

beforeAll(async () => {
  t = await createTestApp(
    { NODE_ENV: 'production', SESSION_SECRET: 'production-like-secret-for-tests-only-0123456789', LOG_LEVEL: 'silent', BCRYPT_COST: '4', TRUST_PROXY: 'true' },
    { catcher: false, serveClient: true },
  );
});
afterAll(async () => {
  await t.close();
});

/** The CSP header split into directive → sources. */
function directives(csp: string) {
  return new Map(
    csp
      .split(';')
      .map((d) => d.trim())
      .filter(Boolean)
      .map((d) => {
        const [name, ...sources] = d.split(/\s+/);
        return [name, sources] as const;
      }),
  );
}

function expectProductionHeaders(res: request.Response) {
  expect(res.headers['strict-transport-security']).toBe('max-age=31536000; includeSubDomains');
  const csp = directives(String(res.headers['content-security-policy']));
  expect(csp.get('script-src')).toEqual(["'self'"]);
  expect(csp.get('default-src')).toEqual(["'self'"]);
  expect(csp.get('object-src')).toEqual(["'none'"]);
  expect(csp.get('frame-ancestors')).toEqual(["'none'"]);
  expect(csp.get('base-uri')).toEqual(["'none'"]);
  expect(csp.get('form-action')).toEqual(["'self'"]);
  expect(csp.has('upgrade-insecure-requests')).toBe(true);
  expect(csp.has('script-src-attr') ? csp.get('script-src-attr') : ["'none'"]).toEqual(["'none'"]);
  expect(res.headers['x-content-type-options']).toBe('nosniff');
  expect(res.headers['referrer-policy']).toBe('strict-origin-when-cross-origin');
  expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
  expect(res.headers['cross-origin-opener-policy']).toBe('same-origin');
  expect(res.headers['cross-origin-resource-policy']).toBe('same-origin');
  expectPermissionsPolicy(res);
  expect(res.headers['x-powered-by']).toBeUndefined();
}

/** The Permissions-Policy header split into feature → allowlist (structured-field dictionary, RFC 8941). */
function permissions(header: string) {
  return new Map(
    header.split(',').map((item) => {
      const [feature, allow] = item.trim().split('=');
      return [feature, allow] as const;
    }),
  );
}

function expectPermissionsPolicy(res: request.Response) {
  const policy = permissions(String(res.headers['permissions-policy']));
  // Nothing in the app uses these; each must be denied to every origin, our own included.
  for (const feature of [
    'camera',
    'microphone',
    'geolocation',
    'payment',
    'usb',
    'serial',
    'hid',
    'midi',
    'display-capture',
    'fullscreen',
    'clipboard-read',
    'publickey-credentials-get',
  ]) {
    expect(policy.get(feature), feature).toBe('()');
  }
  // The calculators' copy button writes to the clipboard, from our own origin only.
  expect(policy.get('clipboard-write')).toBe('(self)');
  expect(
    [...policy.values()].every((allow) => allow === '()' || allow === '(self)'),
    'no feature is open to other origins',
  ).toBe(true);
}

describe('security headers in production', () => {
  it('GET /api/health carries HSTS, a strict CSP, nosniff, frame-ancestors and a referrer policy, and is never cached', async () => {
    const res = await request(t.app).get('/api/health').set(https);
    expect(res.status).toBe(200);
    expectProductionHeaders(res);
    expect(res.headers['cache-control']).toBe('no-store');
  });

  it("the build's files never carry a session cookie (a late one would undo a sign-in), API answers to a session do", async () => {
    // Secure cookies: sent back by hand (the test talks plain HTTP behind a pretend TLS proxy).
    const csrf = await request(t.app).get('/api/csrf').set(https);
    expect(csrf.status).toBe(200);
    const cookie = String(csrf.headers['set-cookie']?.[0] ?? '').split(';')[0];
    expect(cookie).toMatch(/=/);
    const send = (p: string) => request(t.app).get(p).set(https).set('Cookie', cookie);
    // The session exists now; an API answer to it refreshes its cookie (rolling sessions), so this check can fail.
    expect((await send('/api/auth/me')).headers['set-cookie']).toBeDefined();
    const page = await send('/calculators');
    const assets = [...page.text.matchAll(/(?:src|href)="(\/assets\/[^"]+)"/g)].map((m) => m[1]);
    expect(assets.length).toBeGreaterThan(0);
    for (const file of [...assets, '/sw.js', '/manifest.webmanifest']) {
      const res = await send(file);
      expect(res.status, file).toBe(200);
      expect(res.headers['set-cookie'], file).toBeUndefined();
    }
  });

  it('error answers carry the same headers and no stack trace', async () => {
    const res = await request(t.app).get('/api/no-such-route').set(https);
    expect(res.status).toBe(404);
    expectProductionHeaders(res);
    expect(res.text).not.toMatch(/at .*\.ts:\d+/);
  });

  it('pages of the client carry the same headers, and the built HTML has no inline script or event handler', async () => {
    // A page the server does not draw (drawn pages add a JSON data block, tested in tests/server/pages).
    const res = await request(t.app).get('/calculators').set(https);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/html/);
    expectProductionHeaders(res);
    const html = res.text;
    const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)];
    expect(scripts.length).toBeGreaterThan(0);
    for (const [, attrs, inline] of scripts) {
      expect(attrs).toMatch(/\bsrc=/);
      expect(inline.trim()).toBe('');
    }
    expect(html).not.toMatch(/\son[a-z]+\s*=/i);
    expect(html).not.toMatch(/javascript:/i);
    // The built HTML, with only preload hints added by the server.
    const added = html.replace(/<link rel="(?:preload|modulepreload)"[^>]*>/g, '');
    expect(added).toBe(fs.readFileSync(path.resolve('dist', 'index.html'), 'utf8'));
  });

  it('downloads and the API document carry the same cross-origin and permissions headers', async () => {
    for (const url of ['/api/openapi.json', '/schemas/setup-record.v1.json', '/api/docs']) {
      const res = await request(t.app).get(url).set(https);
      expect(res.status, url).toBe(200);
      expect(res.headers['cross-origin-resource-policy'], url).toBe('same-origin');
      expect(res.headers['cross-origin-opener-policy'], url).toBe('same-origin');
      expectPermissionsPolicy(res);
    }
  });

  it('hashed assets are served with a script-safe content type and long caching', async () => {
    const html = (await request(t.app).get('/').set(https)).text;
    // The first hashed script (the theme is set earlier by /theme-init.js, a file of its own that is not hashed).
    const src = /<script[^>]+src="(\/assets\/[^"]+)"/.exec(html)?.[1];
    expect(src).toMatch(/^\/assets\/.+\.js$/);
    const res = await request(t.app).get(src!).set(https);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^(text|application)\/javascript/);
    expect(res.headers['cache-control']).toMatch(/immutable/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['cross-origin-resource-policy']).toBe('same-origin');
    expectPermissionsPolicy(res);
    // The unhashed theme script: a script type too, and never cached as immutable (its address does not change with it).
    expect(html).toContain('<script src="/theme-init.js"></script>');
    const theme = await request(t.app).get('/theme-init.js').set(https);
    expect(theme.status).toBe(200);
    expect(theme.headers['content-type']).toMatch(/^(text|application)\/javascript/);
    expect(theme.headers['x-content-type-options']).toBe('nosniff');
    expect(theme.headers['cache-control'] ?? '').not.toMatch(/immutable/);
  });

  it('does not mount the local mail viewer or list it in the API document', async () => {
    expect((await request(t.app).get('/api/dev/mail').set(https)).status).toBe(404);
    const doc = await request(t.app).get('/api/openapi.json').set(https);
    expect(Object.keys(doc.body.paths)).not.toContain('/api/dev/mail');
  });
});

describe('session cookie in production', () => {
  it('POST /api/auth/sign-in over HTTPS sets a __Host- Secure, HttpOnly, SameSite=Lax cookie that lives as long as the idle timeout', async () => {
    const { user, password } = await createUser(t);
    // By hand: a cookie jar rightly withholds a Secure cookie from the plain-HTTP test connection.
    const first = await request(t.app).get('/api/csrf').set(https).expect(200);
    const visitorCookie = (first.headers['set-cookie'] as unknown as string[])[0].split(';')[0];
    const res = await request(t.app)
      .post('/api/auth/sign-in')
      .set(https)
      .set('Cookie', visitorCookie)
      .set('x-csrf-token', first.body.data.token)
      .send({ email: user.email, password });
    expect(res.status).toBe(200);
    // __Host-: the browser takes it only with Secure, Path=/ and no Domain, so no other host or path can plant it.
    const cookie = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('__Host-tw.sid='));
    expect(cookie).toBeDefined();
    const attrs = cookie!.split(';').map((a) => a.trim().toLowerCase());
    expect(attrs).toContain('secure');
    expect(attrs).toContain('httponly');
    expect(attrs).toContain('samesite=lax');
    expect(attrs).toContain('path=/');
    expect(attrs.some((a) => a.startsWith('domain='))).toBe(false);
    const expires = Date.parse(attrs.find((a) => a.startsWith('expires='))!.slice('expires='.length));
    const days = (expires - Date.now()) / 86_400_000;
    // A member's idle timeout (two days by default); the server also ends it 14 days after sign-in.
    expect(days).toBeGreaterThan(1.9);
    expect(days).toBeLessThan(2.1);
  });

  it('never sends the session cookie over plain HTTP', async () => {
    const res = await request(t.app).get('/api/csrf');
    expect(res.status).toBe(200);
    const cookies = (res.headers['set-cookie'] as unknown as string[] | undefined) ?? [];
    expect(cookies.some((c) => /^(__Host-)?tw\.sid=/.test(c))).toBe(false);
  });
});

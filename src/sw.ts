/// <reference lib="webworker" />
/**
 * Tunewright's service worker. Built by vite-plugin-pwa (injectManifest), which puts this build's file
 * list in place of `self.__WB_MANIFEST`.
 *
 * - Code and styles: precached as one versioned set (Workbox precaching), served from the cache first.
 *   A new build installs beside the old one and waits; the page decides when it takes over (a reload at
 *   the next navigation, or when the reader presses "Reload"), so a page never mixes two builds.
 * - Pages and API reads: network first; the answer is stored, and when the network fails the stored copy
 *   is served with the time it was fetched (a header on API answers, a meta element in a page), so the
 *   page can say it is a saved copy and from when. A page never opened falls back to the app shell.
 * - Answers to a signed-in member go to a private cache, removed when the session ends (sign-out, sign-in
 *   as someone else, or the server saying there is no session), so the next person on the device sees none.
 */
import { cleanupOutdatedCaches, matchPrecache, precacheAndRoute } from 'workbox-precaching';
import { registerRoute } from 'workbox-routing';
import type { PrecacheEntry } from 'workbox-precaching';
import {
  NOT_STORED_API,
  PRIVATE_CACHE,
  PRIVATE_HEADER,
  PUBLIC_CACHE,
  PUBLIC_CACHE_MAX_ENTRIES,
  SAVED_AT_HEADER,
  SAVED_AT_META,
  type KeepResult,
  type WorkerMessage,
} from '../shared/offline';

declare const self: ServiceWorkerGlobalScope & { __WB_MANIFEST: Array<PrecacheEntry | string> };

// directoryIndex and cleanURLs off: "/" and "/guides" are pages the server draws, never the precached shell.
precacheAndRoute(self.__WB_MANIFEST, { directoryIndex: '', cleanURLs: false });
cleanupOutdatedCaches();

// A first install takes the open pages at once (they run this very build); an update waits for the page.
self.addEventListener('activate', (event) => event.waitUntil(self.clients.claim()));

/** When the last sign-out happened: an answer to a request sent before it is not stored as private. */
let sessionEndedAt = 0;

async function forgetPrivate() {
  sessionEndedAt = Date.now();
  await caches.delete(PRIVATE_CACHE);
}

/** A copy of `res` that carries the time it was fetched, ready to store. */
async function stamped(res: Response): Promise<Response> {
  const headers = new Headers(res.headers);
  headers.set(SAVED_AT_HEADER, new Date().toISOString());
  return new Response(await res.blob(), { status: res.status, statusText: res.statusText, headers });
}

/** Stores a good answer in the cache its audience allows, and drops any older copy from the other one. */
async function store(request: Request, res: Response, sentAt: number) {
  const isPrivate = res.headers.has(PRIVATE_HEADER);
  if (isPrivate && sentAt < sessionEndedAt) return;
  const key = new Request(request.url, { credentials: 'same-origin' });
  const copy = await stamped(res);
  const [into, other] = isPrivate ? [PRIVATE_CACHE, PUBLIC_CACHE] : [PUBLIC_CACHE, PRIVATE_CACHE];
  await (await caches.open(into)).put(key, copy);
  await (await caches.open(other)).delete(key);
  if (!isPrivate) {
    const cache = await caches.open(PUBLIC_CACHE);
    const keys = await cache.keys(); // oldest first
    for (const old of keys.slice(0, Math.max(0, keys.length - PUBLIC_CACHE_MAX_ENTRIES))) await cache.delete(old);
  }
}

/** The stored copy of a URL: the member's own first, then the public one. */
async function saved(url: string): Promise<Response | undefined> {
  return (await (await caches.open(PRIVATE_CACHE)).match(url)) ?? (await (await caches.open(PUBLIC_CACHE)).match(url));
}

const isJson = (res: Response) => (res.headers.get('content-type') ?? '').includes('application/json');
const isHtml = (res: Response) => (res.headers.get('content-type') ?? '').includes('text/html');

/** Fetches, stores what may be stored, and notices the end of a session. */
async function fetchAndStore(request: Request, kind: 'page' | 'api'): Promise<Response> {
  const sentAt = Date.now();
  const res = await fetch(request);
  const url = new URL(request.url);
  // The server answers "who am I" without the private mark only when there is no session: whatever a
  // previous member left here goes (a session that timed out never sent a sign-out).
  if (url.pathname === '/api/auth/me' && res.ok && !res.headers.has(PRIVATE_HEADER)) await forgetPrivate();
  if (res.status === 200 && (kind === 'api' ? isJson(res) : isHtml(res))) await store(request, res.clone(), sentAt);
  return res;
}

/** Puts the saved-at time into a stored page's head, for the page to show. */
async function markPage(res: Response): Promise<Response> {
  const at = res.headers.get(SAVED_AT_HEADER) ?? '';
  const html = (await res.text()).replace('</head>', () => `<meta name="${SAVED_AT_META}" content="${at.replace(/[^0-9TZ:.+-]/g, '')}"></head>`);
  const headers = new Headers(res.headers);
  headers.delete('content-length');
  return new Response(html, { status: 200, headers });
}

/** The scripts a stored page starts: if this build no longer has them, the page cannot run offline. */
async function runsWithThisBuild(res: Response): Promise<boolean> {
  const html = await res.clone().text();
  const scripts = [...html.matchAll(/<script[^>]+src="(\/assets\/[^"]+\.js)"/g)].map((m) => m[1]);
  for (const src of scripts) if (!(await matchPrecache(src))) return false;
  return true;
}

registerRoute(
  ({ request, url }) => request.mode === 'navigate' && url.origin === self.location.origin && !url.pathname.startsWith('/api/'),
  async ({ request }) => {
    try {
      return await fetchAndStore(request, 'page');
    } catch {
      const copy = await saved(request.url);
      if (copy && (await runsWithThisBuild(copy))) return markPage(copy);
      // Never opened (or stored by an older build): the app shell, which then reads the stored API answers.
      return (await matchPrecache('/index.html')) ?? Response.error();
    }
  },
);

registerRoute(
  ({ url, request }) =>
    request.method === 'GET' && url.origin === self.location.origin && url.pathname.startsWith('/api/') && !NOT_STORED_API.some((re) => re.test(url.pathname)),
  async ({ request }) => {
    try {
      return await fetchAndStore(request, 'api');
    } catch (err) {
      const copy = await saved(request.url);
      if (copy) return copy; // carries SAVED_AT_HEADER: the API client reports the page as a saved copy
      throw err;
    }
  },
);

/** Fetches and stores pages and API reads on the page's request ("Keep for the track"). */
async function keep(pages: string[], api: string[]): Promise<KeepResult> {
  const failed: string[] = [];
  let count = 0;
  const one = async (url: string, kind: 'page' | 'api') => {
    const target = new URL(url, self.location.origin);
    if (target.origin !== self.location.origin) return void failed.push(url); // only this site's pages and answers
    try {
      const request = new Request(target.href, {
        credentials: 'same-origin',
        headers: { Accept: kind === 'page' ? 'text/html' : 'application/json' },
      });
      const res = await fetchAndStore(request, kind);
      if (res.status === 200) count++;
      else failed.push(url);
    } catch {
      failed.push(url);
    }
  };
  // A few at a time: a phone on a weak signal gains nothing from dozens of parallel requests.
  const queue = [...pages.map((u) => [u, 'page'] as const), ...api.map((u) => [u, 'api'] as const)];
  const workers = Array.from({ length: 4 }, async () => {
    for (let next = queue.shift(); next; next = queue.shift()) await one(next[0], next[1]);
  });
  await Promise.all(workers);
  return { saved: count, failed, at: new Date().toISOString() };
}

self.addEventListener('message', (event) => {
  const msg = event.data as WorkerMessage | undefined;
  if (!msg || typeof msg !== 'object') return;
  if (msg.type === 'SKIP_WAITING') void self.skipWaiting();
  else if (msg.type === 'FORGET_PRIVATE') event.waitUntil(forgetPrivate().then(() => event.ports[0]?.postMessage({ done: true })));
  else if (msg.type === 'KEEP') {
    const pages = Array.isArray(msg.pages) ? msg.pages.filter((u) => typeof u === 'string') : [];
    const api = Array.isArray(msg.api) ? msg.api.filter((u) => typeof u === 'string') : [];
    event.waitUntil(keep(pages, api).then((result) => event.ports[0]?.postMessage(result)));
  }
});

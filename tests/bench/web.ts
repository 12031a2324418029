// `npm run bench:web`: builds the client, serves it with seeded content from an in-process server on
// loopback, and loads the home, parameter, guide and search pages in headless Chromium under a phone
// profile (4× CPU slowdown, 1.6 Mbit/s down, 0.75 Mbit/s up, 150 ms round trip, as in Lighthouse's
// mobile preset). It prints the bytes as transferred (what the browser received over the wire, compressed
// as the server sent it, read from Chromium's own accounting) and the Largest Contentful Paint.
// `npm run bench:web -- --why` also lists, per page, every script it transferred, largest first, with the
// packages (or our own folders) that weigh most inside each (from the build's chunk report, see vite.config.ts).
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ensurePostgresInstalled, freePort, startCluster } from '../../server/bin/postgres.mjs';

const WHY = process.argv.includes('--why');
const TARGET_JS_KB = 150;
const TARGET_LCP_S = 2.5; // Core Web Vitals "good" (web.dev)
const GUIDE_SLUG = process.env.BENCH_GUIDE ?? 'stock-2wd-buggy-harbour-flats-clay';
const RUNS = Number(process.env.BENCH_RUNS ?? 5);
const root = path.resolve(import.meta.dirname, '..', '..');
const PAGES = [
  { name: 'home', path: '/' },
  { name: 'parameter', path: '/parameters/drag-brake' },
  { name: 'guide', path: `/guides/${GUIDE_SLUG}` },
  { name: 'search', path: '/search?q=drag+brake' },
];

function buildClient() {
  const r = spawnSync(process.execPath, [path.join(root, 'node_modules', 'vite', 'bin', 'vite.js'), 'build', '--logLevel', 'warn'], {
    cwd: root,
    stdio: 'inherit',
    env: WHY ? { ...process.env, TW_CHUNK_REPORT: '1' } : process.env,
  });
  if (r.status !== 0) throw new Error('vite build failed');
}

/** Chunk file (assets/x.js) → bytes of code (before minifying) each package or folder adds to it. */
function chunkReport(): Record<string, Record<string, number>> {
  const file = path.join(root, 'dist', '.vite', 'chunk-modules.json');
  return fs.existsSync(file) ? (JSON.parse(fs.readFileSync(file, 'utf8')) as Record<string, Record<string, number>>) : {};
}

/** "react-dom 62 %, react-router 25 %, …": what makes up one chunk, largest first. */
function whatsInside(report: Record<string, Record<string, number>>, url: string): string {
  const parts = report[url.replace(/^\//, '')];
  if (!parts) return '';
  const total = Object.values(parts).reduce((n, b) => n + b, 0) || 1;
  const top = Object.entries(parts)
    .sort((a, b) => b[1] - a[1])
    .slice(0, 4)
    .map(([name, b]) => `${name} ${Math.round((100 * b) / total)} %`);
  return top.join(', ') + (Object.keys(parts).length > 4 ? `, +${Object.keys(parts).length - 4} more` : '');
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
type Transfer = { url: string; type: string; kb: number; rawKb: number };

async function main() {
  console.log('[bench:web] building the client…');
  buildClient();
  const report = WHY ? chunkReport() : {};

  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-bench-web-'));
  const cluster = startCluster({ bin: ensurePostgresInstalled(() => {}), dir, port: await freePort(), log: () => {} });
  // The test harness's own database template, app wiring and seeding, so the bench serves what the app serves.
  process.env.TEST_PG_ADMIN_URL = cluster.adminUrl;
  process.env.NODE_ENV = 'test';
  const cleanup: Array<() => Promise<void> | void> = [() => cluster.stop(), () => fs.rmSync(dir, { recursive: true, force: true })];
  let over = false;
  try {
    const { default: setupTemplate } = await import('../setup/global-setup');
    await setupTemplate();
    const { start } = await import('../setup/e2e-server');
    const server = await start();
    cleanup.unshift(() => server.close());
    const { launchBrowser } = await import('../setup/browser');
    const browser = await launchBrowser();
    cleanup.unshift(() => browser.close());
    console.log(
      `[bench:web] load average at start: ${os
        .loadavg()
        .map((l) => l.toFixed(2))
        .join(' ')} on ${os.cpus().length} cores`,
    );

    for (const target of PAGES) {
      const url = `${server.baseUrl}${target.path}`;
      const lcps: number[] = [];
      let transfers: Transfer[] = [];
      for (let run = 0; run < RUNS; run++) {
        // A fresh context each run: no HTTP cache, no service worker, a cold load every time.
        const context = await browser.newContext({ viewport: { width: 412, height: 860 } });
        const page = await context.newPage();
        const cdp = await context.newCDPSession(page);
        await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 });
        await cdp.send('Network.enable');
        await cdp.send('Network.emulateNetworkConditions', {
          offline: false,
          latency: 150,
          downloadThroughput: (1.6e6 / 8) * 0.9,
          uploadThroughput: (0.75e6 / 8) * 0.9,
        });
        await page.addInitScript(() => {
          const w = window as unknown as { __lcp: number };
          w.__lcp = 0;
          new PerformanceObserver((list) => {
            for (const e of list.getEntries()) w.__lcp = e.startTime;
          }).observe({ type: 'largest-contentful-paint', buffered: true });
        });
        const seen: Array<Promise<Transfer>> = [];
        page.on('requestfinished', (req) => {
          // responseBodySize is the body as received (still encoded); the decoded length is what it unpacks to.
          seen.push(
            Promise.all([req.sizes(), req.response().then((r) => r?.body().catch(() => Buffer.alloc(0)) ?? Buffer.alloc(0))]).then(([s, body]) => ({
              url: new URL(req.url()).pathname,
              type: req.resourceType(),
              kb: (s.responseBodySize + s.responseHeadersSize) / 1024,
              rawKb: body.length / 1024,
            })),
          );
        });
        await page.goto(url, { waitUntil: 'networkidle' });
        await page.locator('h1').first().waitFor();
        // LCP is final once the page is idle; a short settle lets the last candidate be reported.
        await page.waitForTimeout(300);
        lcps.push(await page.evaluate(() => (window as unknown as { __lcp: number }).__lcp));
        if (run === 0) transfers = await Promise.all(seen);
        await context.close();
      }
      const scripts = transfers.filter((t) => t.type === 'script');
      const jsKb = scripts.reduce((n, s) => n + s.kb, 0);
      const jsRawKb = scripts.reduce((n, s) => n + s.rawKb, 0);
      const totalKb = transfers.reduce((n, s) => n + s.kb, 0);
      const lcpS = median(lcps) / 1000;
      const bad = jsKb > TARGET_JS_KB || lcpS > TARGET_LCP_S;
      over ||= bad;
      console.log(`\n[bench:web] ${target.name} page ${target.path}`);
      for (const s of [...scripts].sort((a, b) => b.kb - a.kb).slice(0, WHY ? scripts.length : 6)) {
        console.log(`  ${s.kb.toFixed(1).padStart(7)} KB sent (${s.rawKb.toFixed(1)} KB unpacked)  ${s.url}`);
        if (WHY) console.log(`            ${whatsInside(report, s.url) || '(not in the chunk report)'}`);
      }
      console.log(
        `  JavaScript as transferred: ${jsKb.toFixed(1)} KB in ${scripts.length} files (${jsRawKb.toFixed(1)} KB unpacked)   target ≤ ${TARGET_JS_KB} KB`,
      );
      console.log(`  Everything as transferred: ${totalKb.toFixed(1)} KB in ${transfers.length} requests (headers included)`);
      console.log(
        `  LCP, phone profile, median of ${RUNS}: ${lcpS.toFixed(2)} s (runs: ${lcps.map((l) => (l / 1000).toFixed(2)).join(', ')})   target ≤ ${TARGET_LCP_S.toFixed(1)} s   ${bad ? 'OVER' : 'OK'}`,
      );
    }
    if (process.argv.includes('--strict') && over) process.exitCode = 1;
  } finally {
    for (const c of cleanup) await c();
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});

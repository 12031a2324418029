// `npm run bench:web`: builds the client, serves it with seeded content from an in-process server on
// loopback, and measures a guide page in headless Chromium: the gzipped JavaScript it loads and its
// Largest Contentful Paint with the CPU slowed 4× (roughly a mid-range phone at the track).
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import { ensurePostgresInstalled, freePort, startCluster } from '../../server/bin/postgres.mjs';

const TARGET_JS_KB = 150;
const TARGET_LCP_S = 1.0;
const GUIDE_SLUG = process.env.BENCH_GUIDE ?? 'stock-2wd-buggy-harbour-flats-clay';
const RUNS = Number(process.env.BENCH_RUNS ?? 5);
const root = path.resolve(import.meta.dirname, '..', '..');

function buildClient() {
  const r = spawnSync(process.execPath, [path.join(root, 'node_modules', 'vite', 'bin', 'vite.js'), 'build', '--logLevel', 'warn'], {
    cwd: root,
    stdio: 'inherit',
  });
  if (r.status !== 0) throw new Error('vite build failed');
}

const gzipKb = (buf: Buffer) => zlib.gzipSync(buf, { level: 9 }).length / 1024;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function main() {
  console.log('[bench:web] building the client…');
  buildClient();

  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-bench-web-'));
  const cluster = startCluster({ bin: ensurePostgresInstalled(() => {}), dir, port: await freePort(), log: () => {} });
  // The test harness's own database template, app wiring and seeding, so the bench serves what the app serves.
  process.env.TEST_PG_ADMIN_URL = cluster.adminUrl;
  process.env.NODE_ENV = 'test';
  const cleanup: Array<() => Promise<void> | void> = [() => cluster.stop(), () => fs.rmSync(dir, { recursive: true, force: true })];
  try {
    const { default: setupTemplate } = await import('../setup/global-setup');
    await setupTemplate();
    const { start } = await import('../setup/e2e-server');
    const server = await start();
    cleanup.unshift(() => server.close());
    const { launchBrowser } = await import('../setup/browser');
    const browser = await launchBrowser();
    cleanup.unshift(() => browser.close());

    const url = `${server.baseUrl}/guides/${GUIDE_SLUG}`;
    const lcps: number[] = [];
    let scripts: Array<{ url: string; kb: number }> = [];
    for (let run = 0; run < RUNS; run++) {
      // A fresh context each run: no HTTP cache, no service worker, a cold load every time.
      const context = await browser.newContext({ viewport: { width: 412, height: 860 } });
      const page = await context.newPage();
      const cdp = await context.newCDPSession(page);
      await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 });
      await page.addInitScript(() => {
        const w = window as unknown as { __lcp: number; __lcpLog: string[] };
        w.__lcp = 0;
        w.__lcpLog = [];
        new PerformanceObserver((list) => {
          for (const e of list.getEntries()) {
            w.__lcp = e.startTime;
            const el = (e as PerformanceEntry & { element?: Element; size?: number }).element;
            w.__lcpLog.push(
              `${Math.round(e.startTime)} ms ${el ? el.tagName.toLowerCase() + (el.id ? '#' + el.id : '') : '?'} size ${(e as unknown as { size: number }).size}`,
            );
          }
        }).observe({ type: 'largest-contentful-paint', buffered: true });
        new PerformanceObserver((list) => {
          for (const e of list.getEntries()) w.__lcpLog.push(`${Math.round(e.startTime)} ms ${e.name}`);
        }).observe({ type: 'paint', buffered: true });
      });
      const seen: Array<Promise<{ url: string; kb: number }>> = [];
      page.on('response', (res) => {
        if (res.request().resourceType() === 'script') seen.push(res.body().then((b) => ({ url: new URL(res.url()).pathname, kb: gzipKb(b) })));
      });
      await page.goto(url, { waitUntil: 'networkidle' });
      await page.locator('h1#guide-title').waitFor();
      // LCP is final once the page is idle; a short settle lets the last candidate be reported.
      await page.waitForTimeout(300);
      lcps.push(await page.evaluate(() => (window as unknown as { __lcp: number }).__lcp));
      if (process.env.BENCH_TRACE && run === 0)
        console.log(
          await page.evaluate(() =>
            performance
              .getEntriesByType('resource')
              .map((e) => `${Math.round(e.startTime)}-${Math.round((e as PerformanceResourceTiming).responseEnd)} ${e.name.replace(location.origin, '')}`)
              .join('\n'),
          ),
        );
      if (process.env.BENCH_TRACE)
        console.log(
          await page.evaluate(() => {
            const n = performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming;
            return `nav: request ${Math.round(n.requestStart)} responseStart ${Math.round(n.responseStart)} responseEnd ${Math.round(n.responseEnd)} domInteractive ${Math.round(n.domInteractive)} domContentLoaded ${Math.round(n.domContentLoadedEventEnd)}`;
          }),
        );
      if (process.env.BENCH_TRACE)
        console.log(`run ${run + 1}:`, (await page.evaluate(() => (window as unknown as { __lcpLog: string[] }).__lcpLog)).join(' | '));
      if (run === 0) scripts = await Promise.all(seen);
      await context.close();
    }

    const totalKb = scripts.reduce((n, s) => n + s.kb, 0);
    const lcpS = median(lcps) / 1000;
    console.log(`\n[bench:web] guide page ${url.replace(server.baseUrl, '')}`);
    for (const s of [...scripts].sort((a, b) => b.kb - a.kb)) console.log(`  ${s.kb.toFixed(1).padStart(7)} KB  ${s.url}`);
    console.log(
      `  JavaScript loaded (gzip): ${totalKb.toFixed(1)} KB in ${scripts.length} files   target ≤ ${TARGET_JS_KB} KB   ${totalKb <= TARGET_JS_KB ? 'OK' : 'OVER'}`,
    );
    console.log(
      `  LCP, 4× CPU throttling, median of ${RUNS}: ${lcpS.toFixed(2)} s (runs: ${lcps.map((l) => (l / 1000).toFixed(2)).join(', ')})   target ≤ ${TARGET_LCP_S.toFixed(1)} s   ${lcpS <= TARGET_LCP_S ? 'OK' : 'OVER'}`,
    );
    if (process.argv.includes('--strict') && (totalKb > TARGET_JS_KB || lcpS > TARGET_LCP_S)) process.exitCode = 1;
  } finally {
    for (const c of cleanup) await c();
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});

import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, screenshot, VIEWPORTS, waitForApp, watchPageErrors } from '../setup/browser';
import { start, type E2EServer } from '../setup/e2e-server';
import type { Browser } from 'playwright-core';

// A deployment while a reader has the app open: the first server serves dist/ (built by npm test), the second
// a build of the same code with another build id (so its app chunk and service worker differ), on the same
// address and database. The open page must end up running the new build only, never a mix of both.
const SECOND_BUILD = 'second-build-for-the-update-test';
let outDir: string;
let first: E2EServer;
let second: E2EServer | null = null;
let browser: Browser;

beforeAll(async () => {
  outDir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-second-build-'));
  const built = spawnSync(
    process.execPath,
    [path.resolve('node_modules', 'vite', 'bin', 'vite.js'), 'build', '--outDir', outDir, '--emptyOutDir', '--logLevel', 'error'],
    { env: { ...process.env, TW_BUILD_ID: SECOND_BUILD }, encoding: 'utf8' },
  );
  if (built.status !== 0) throw new Error(`the second build failed: ${built.stderr}`);
  first = await start();
  browser = await launchBrowser();
}, 400_000);
afterAll(async () => {
  await browser?.close();
  await second?.close();
  await first?.close();
  if (outDir) fs.rmSync(outDir, { recursive: true, force: true });
});

/** Every build script the document has loaded (entry, preloads, lazy chunks), as paths. */
const loadedScripts = (page: import('playwright-core').Page) =>
  page.evaluate(() =>
    performance
      .getEntriesByType('resource')
      .map((e) => new URL(e.name).pathname)
      .filter((p) => /^\/assets\/.+\.js$/.test(p)),
  );

describe('a new deployment reaches an open page, in Chromium', () => {
  // Skipped, open in #18: after any in-app navigation on the old build, the waiting worker receives SKIP_WAITING (seen
  // with a postMessage probe) but stays "installed" for minutes, so the page never switches; sent while the page is
  // idle before that navigation, the same message activates it within a second. Found on 2026-12-05, cause not yet
  // known (something the old worker is still doing holds the activation). Unskip with the fix.
  it.skip('the page learns of the new build at an in-app navigation, says so, and the next navigation reloads it into the new build alone', async () => {
    const context = await browser.newContext({ viewport: VIEWPORTS.desktop });
    const page = await context.newPage();
    const errors = watchPageErrors(page);
    await page.goto(`${first.baseUrl}/guides`);
    await waitForApp(page);
    await page.waitForFunction(() => navigator.serviceWorker?.controller != null, undefined, { timeout: 90_000 });
    const firstBuild = await page.evaluate(() => document.documentElement.dataset.build);
    expect(firstBuild).toBeTruthy();
    expect(firstBuild).not.toBe(SECOND_BUILD);

    // The deployment: the old server stops, the new one answers at the same address from the same database.
    await first.stopListening();
    second = await start({ clientDir: outDir, port: Number(new URL(first.baseUrl).port), db: first.t.db });

    // The reader keeps using the open page. In-app navigations look for a new build (at most every 30 s); once it
    // has installed, the page says so.
    const nav = page.getByRole('navigation', { name: /main/i });
    const notice = page.getByTestId('update-notice');
    const deadline = Date.now() + 150_000;
    let turn = 0;
    while (!(await notice.isVisible())) {
      if (Date.now() > deadline) throw new Error('the page never said a new version was ready');
      // Still the old build meanwhile, drawn from its own files.
      expect(await page.evaluate(() => document.documentElement.dataset.build)).toBe(firstBuild);
      await nav.getByRole('link', { name: turn++ % 2 ? 'Guides' : 'Parameters' }).click();
      await page.locator('h1').first().waitFor();
      await notice.waitFor({ timeout: 5_000 }).catch(() => undefined);
    }
    await screenshot(page, 'update-ready');

    // The next navigation switches: a whole-page reload, after which every script comes from the new build.
    const log: string[] = [];
    page.on('console', (m) => log.push(`${m.type()}: ${m.text()}`));
    page.on('framenavigated', (f) => f === page.mainFrame() && log.push(`navigated: ${f.url()}`));
    await nav.getByRole('link', { name: 'Calculators' }).click();
    await page
      .waitForFunction((id) => document.documentElement.dataset.build === id, SECOND_BUILD, { timeout: 60_000 })
      .catch(async (err) => {
        const state = await page.evaluate(async () => ({
          url: location.href,
          build: document.documentElement.dataset.build,
          controller: navigator.serviceWorker.controller?.scriptURL ?? null,
          waiting: !!(await navigator.serviceWorker.getRegistration())?.waiting,
          active: (await navigator.serviceWorker.getRegistration())?.active?.state ?? null,
        }));
        throw new Error(`${(err as Error).message}\n${JSON.stringify(state)}\n${log.join('\n')}`);
      });
    await waitForApp(page);
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    expect(new URL(page.url()).pathname).toBe('/calculators');
    const scripts = await loadedScripts(page);
    expect(scripts.length).toBeGreaterThan(2);
    const missing = scripts.filter((p) => !fs.existsSync(path.join(outDir, p)));
    expect(missing).toEqual([]);
    // The new build's own app chunk is the one running (it differs from the first build's).
    const secondIndex = fs.readFileSync(path.join(outDir, 'index.html'), 'utf8');
    const entry = /<script type="module" crossorigin src="([^"]+)"/.exec(secondIndex)![1];
    expect(scripts).toContain(entry);
    expect(await notice.count()).toBe(0);
    expect(errors).toEqual([]);
    await context.close();
  }, 400_000);
});

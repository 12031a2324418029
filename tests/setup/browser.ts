import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type LaunchOptions, type Page } from 'playwright-core';

/** Flags that keep headless Chromium quiet and offline (see architecture.md). */
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** The system Chromium, driven by playwright-core (never a downloaded browser). */
export function launchBrowser(opts: LaunchOptions = {}): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    ...opts,
    args: [...CHROMIUM_ARGS, ...(opts.args ?? [])],
  });
}

/** Where a screenshot named `name` (without .png) goes: .test-artifacts/screenshots/, created on demand. */
export function screenshotPath(name: string): string {
  const dir = path.resolve(process.cwd(), '.test-artifacts', 'screenshots');
  fs.mkdirSync(dir, { recursive: true });
  return path.join(dir, `${name.replace(/[^a-z0-9._-]+/gi, '-')}.png`);
}

/** Common viewports: a laptop and a 375 px phone. */
export const VIEWPORTS = {
  desktop: { width: 1280, height: 900 },
  phone: { width: 375, height: 780 },
} as const;

/** Saves a full-page screenshot under .test-artifacts/screenshots/<name>.png. */
export async function screenshot(page: Page, name: string) {
  const file = screenshotPath(name);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** Collects uncaught page errors and console errors, so a test can assert the page stayed healthy. */
export function watchPageErrors(page: Page) {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' && !/Failed to load resource/.test(m.text())) errors.push(`console: ${m.text()}`);
  });
  return errors;
}

/** Records the paths of the page's API requests (to check what a server-drawn page did not ask for again). */
export function watchApiRequests(page: Page) {
  const paths: string[] = [];
  page.on('request', (r) => {
    const u = new URL(r.url());
    if (u.pathname.startsWith('/api/')) paths.push(u.pathname);
  });
  return paths;
}

/**
 * Holds the app's code back, as a slow phone would, so a test can act on the server-drawn page first.
 * Returns what lets it through.
 */
export async function holdAppCode(page: Page) {
  let release!: () => void;
  const held = new Promise<void>((r) => (release = r));
  await page.route('**/assets/start-*.js', async (route) => {
    await held;
    await route.continue();
  });
  return release;
}

/** Waits until the app has started in the page (a server-drawn page has been taken over by then). */
export async function waitForApp(page: Page, timeout = 30_000) {
  await page.waitForFunction(() => document.documentElement.dataset.app === 'running', undefined, { timeout });
}

/**
 * Worked-example cards load only as they near the viewport: scrolls each placeholder into view until
 * every card on the page is live (or fails after `timeout`).
 */
export async function revealWorkedExamples(page: Page, timeout = 30_000) {
  const deadline = Date.now() + timeout;
  // Placeholders are drawn with the page's content, so once its heading is there they are too.
  await page.locator('main h1').first().waitFor({ timeout });
  // A page the server drew shows the blocks' source text until the app has started and taken them over.
  await page.waitForFunction(() => !document.querySelector('[data-example-slot] > pre'), undefined, { timeout });
  while (Date.now() < deadline) {
    const handle = await page.$('[data-example-placeholder]');
    if (!handle) return;
    await handle.scrollIntoViewIfNeeded().catch(() => {}); // it may have been replaced already
    const replaced = await page
      .waitForFunction((el) => !el.isConnected, handle, { timeout: Math.max(1, Math.min(15_000, deadline - Date.now())) })
      .then(() => true)
      .catch(() => false);
    // Still there: scroll it out of view and back, as a reader would, so the page sees it come near again.
    if (!replaced) await handle.evaluate((el) => el.isConnected && window.scrollTo(0, 0)).catch(() => {});
  }
  throw new Error('worked-example cards did not load');
}

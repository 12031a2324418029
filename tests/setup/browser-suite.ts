import { afterAll, beforeAll } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser } from './browser';
import { start, type E2EServer, type E2EServerOptions } from './e2e-server';

/** What a browser test file works with: the real app on its own database, and Chromium. */
export type BrowserSuite = { server: E2EServer; browser: Browser };

/**
 * Starts the app and Chromium once for the calling test file and stops both after it. Call at the top
 * of the file; the returned object is filled in before the file's own `beforeAll` hooks run.
 */
export function browserSuite(opts: E2EServerOptions = {}): BrowserSuite {
  const suite = {} as BrowserSuite;
  beforeAll(async () => {
    suite.server = await start(opts);
    suite.browser = await launchBrowser();
  }, 60_000);
  afterAll(async () => {
    await suite.browser?.close();
    await suite.server?.close();
  });
  return suite;
}

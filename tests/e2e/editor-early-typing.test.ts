import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { watchPageErrors } from '../setup/browser';
import { browserSuite } from '../setup/browser-suite';
import { revisionsOf, signedInPage, waitSaved } from './guide-helpers';

const suite = browserSuite();

// How many proposals to type into at the first possible moment. The hand run behind the fix used 20
// (EARLY_TYPING_RUNS=20 npm test -- tests/e2e/editor-early-typing.test.ts); the suite keeps it short.
const RUNS = Number(process.env.EARLY_TYPING_RUNS ?? 4);

// Two processes spinning a core each, so the page's scripts and the server run late, as on a busy machine.
let spinners: ChildProcess[] = [];
beforeAll(() => {
  spinners = [0, 1].map(() => spawn(process.execPath, ['-e', 'const end = Date.now() + 600000; while (Date.now() < end) {}'], { stdio: 'ignore' }));
});
afterAll(() => {
  for (const s of spinners) s.kill('SIGKILL');
});

describe('the editor with an edit typed the moment the field appears', () => {
  it(
    'saves that first edit to the server (it is never taken for the starting text)',
    async () => {
      const slug = 'stock-2wd-buggy-harbour-flats-clay';
      const jonah = await signedInPage(suite.browser, suite.server.baseUrl, 'jonah');
      const errors = watchPageErrors(jonah);
      for (let run = 1; run <= RUNS; run++) {
        const marker = `Early edit number ${run}: typed before anything else had settled.`;
        await jonah.goto(`${suite.server.baseUrl}/guides/${slug}/edit`);
        // The earliest moment: the field exists and takes input (no waiting for the live text to show).
        const body = jonah.getByLabel('Body');
        await body.waitFor({ state: 'attached' });
        const current = await body.inputValue();
        await body.fill(`${current}\n\n${marker}`);
        await waitSaved(jonah, 30_000);
        expect(jonah.url()).toMatch(/\?draft=/);
        const draftId = new URL(jonah.url()).searchParams.get('draft');
        const saved = (await revisionsOf(suite.server.t.db.dataSource, slug)).find((r) => r.id === draftId);
        expect(saved?.content.body, `run ${run}`).toContain(marker);
        // Leave nothing behind for the next run (one draft of a guide per author at a time).
        await suite.server.t.db.dataSource.query('DELETE FROM revisions WHERE id = $1', [draftId]);
        await jonah.evaluate(() => window.localStorage.clear());
      }
      expect(errors).toEqual([]);
    },
    60_000 + RUNS * 45_000,
  );
});

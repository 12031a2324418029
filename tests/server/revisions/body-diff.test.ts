import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { diffWordsWithSpace } from 'diff';
import { boundedBodyDiff } from '../../../server/modules/revisions/body-diff';
import { bodyDiffOffThread, closeBodyDiffWorker, warmBodyDiffWorker } from '../../../server/modules/revisions/body-diff-pool';
import { createClient, createTestApp, type TestApp, type TestClient } from '../../setup/test-app';
import { signedInClient } from '../../factories/user';
import { createPublishedGuide, proposeEdit } from '../../factories/guide';

const WORDS = 'drag brake punch timing pinion spur rollout cutoff pack motor heat clay carpet grip throttle curve expo neutral deadband'.split(' ');
/** A body of about `chars` characters of trade words from a seeded generator, a sentence per `perLine` words. */
function body(seed: number, chars: number, perLine = 12) {
  let x = seed;
  let out = '';
  for (let i = 1; out.length < chars; i++) {
    x = (x * 1103515245 + 12345) & 0x7fffffff;
    out += `${WORDS[x % WORDS.length]}${i % perLine === 0 ? '.\n' : ' '}`;
  }
  return out.slice(0, chars);
}
const text = (parts: { value: string; added?: boolean; removed?: boolean }[], side: 'from' | 'to') =>
  parts
    .filter((p) => (side === 'from' ? !p.added : !p.removed))
    .map((p) => p.value)
    .join('');

describe('bounded body diff', () => {
  it('marks the same words as an unbounded word diff when the edit is small', async () => {
    const from = `${body(7, 3000)}\n\nUnder 75 °C after a race is fine.\n\n${body(8, 3000)}`;
    const to = from.replace('Under 75 °C', 'Under 70 °C');
    const r = await boundedBodyDiff(from, to);
    expect(r.detail).toBe('words');
    const changed = (parts: { value: string; added?: boolean; removed?: boolean }[]) => parts.filter((p) => p.added || p.removed);
    // The diff package's own unbounded word diff as the reference.
    expect(changed(r.parts)).toEqual(
      changed(diffWordsWithSpace(from, to).map((c) => ({ value: c.value, ...(c.added ? { added: true } : {}), ...(c.removed ? { removed: true } : {}) }))),
    );
  });

  it('always rebuilds both texts exactly, however coarse it had to be', async () => {
    for (const [from, to] of [
      [body(1, 16_000), body(2, 16_000)],
      [body(3, 100_000), body(4, 100_000)],
      [body(5, 100_000, 1e9), body(6, 100_000, 1e9)],
      ['', body(9, 500)],
      [body(10, 500), ''],
    ]) {
      const r = await boundedBodyDiff(from, to);
      expect(text(r.parts, 'from')).toBe(from);
      expect(text(r.parts, 'to')).toBe(to);
    }
  });

  it('says when it could not compare word by word', async () => {
    const r = await bodyDiffOffThread(body(3, 100_000), body(4, 100_000));
    expect(r.detail).not.toBe('words');
    expect(text(r.parts, 'to')).toBe(body(4, 100_000));
  });
});

describe('GET /api/guides/:slug/compare and GET /api/reviews/:id with maximum-size bodies', () => {
  let t: TestApp;
  let author: TestClient;
  let mod: TestClient;
  beforeAll(async () => {
    t = await createTestApp({}, { catcher: false });
    ({ client: author } = await signedInClient(t, 'member'));
    ({ client: mod } = await signedInClient(t, 'moderator'));
    warmBodyDiffWorker(); // as server/index.ts does at start
  });
  afterAll(async () => {
    await closeBodyDiffWorker();
    await t.close();
  });

  it('answers with a coarser diff, saying so, and leaves health checks answering meanwhile', async () => {
    const { slug } = await createPublishedGuide(author, mod, { body: body(11, 100_000) });
    const edit = await proposeEdit(author, slug, { body: body(12, 100_000) });
    expect((await author.post(`/api/revisions/${edit.id}/submit`, { note: 'Rewritten from scratch' })).status).toBe(200);
    const visitor = createClient(t.app);
    await visitor.get('/api/health').expect(200);

    // Health requests one after another for as long as the diffs run; the slowest is what a balancer would see.
    let running = true;
    const healthTimes: number[] = [];
    const prober = (async () => {
      while (running) {
        const started = performance.now();
        await visitor.get('/api/health').expect(200);
        healthTimes.push(performance.now() - started);
      }
    })();
    const started = performance.now();
    const review = await mod.get(`/api/reviews/${edit.id}`);
    const reviewMs = performance.now() - started;
    const compare = await visitor.get(`/api/guides/${slug}/compare?from=1&to=1`);
    running = false;
    await prober;

    expect(review.status).toBe(200);
    expect(review.body.data.bodyDiffDetail).not.toBe('words');
    expect(text(review.body.data.bodyDiff, 'to')).toBe(body(12, 100_000));
    expect(compare.status).toBe(200);
    expect(compare.body.data.bodyDiffDetail).toBe('words');
    expect(healthTimes.length).toBeGreaterThan(0);
    // Before the diff was bounded and moved off the request thread, one such review held every request for
    // minutes. The bounds are wide because this machine is shared; the figures are printed for the record.
    console.log(
      `max-size review diff: ${Math.round(reviewMs)} ms; ${healthTimes.length} health checks meanwhile, slowest ${Math.round(Math.max(...healthTimes))} ms`,
    );
    expect(reviewMs).toBeLessThan(5000);
    expect(Math.max(...healthTimes)).toBeLessThan(500);
  });
});

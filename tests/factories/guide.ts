import crypto from 'node:crypto';
import { expect } from 'vitest';
import type { TestClient } from '../setup/test-app';

/** Content of a guide as the editor sends it; titles are unique unless given. */
export function guideInput(overrides: Record<string, unknown> = {}) {
  const n = crypto.randomBytes(3).toString('hex');
  return {
    title: `Stock buggy on Harbour Flats clay ${n}`,
    summary: 'A calm baseline for the tight indoor layout, with gentle punch and a little drag brake.',
    class: 'buggy-2wd-stock',
    surface: 'clay',
    conditions: 'Indoor, high-bite clay, 18 to 21 °C air',
    tags: ['stock', 'indoor'],
    parameters: ['drag-brake', 'throttle-punch'],
    body: [
      '## Gearing',
      '',
      'Start with the gearing below.',
      '',
      '## Brake',
      '',
      'Use a little drag brake for the hairpin.',
      '',
      '## Punch',
      '',
      'Keep punch low on the high-bite surface.',
    ].join('\n'),
    ...overrides,
  };
}

/** Creates a guide draft through the API and returns slug and revision. */
export async function createDraftGuide(author: TestClient, overrides: Record<string, unknown> = {}) {
  const res = await author.post('/api/guides', guideInput(overrides));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { slug: res.body.data.guide.slug as string, revision: res.body.data.revision as { id: string; number: number; state: string } };
}

/** Creates, submits and publishes a guide through the API (the moderator must not be the author). */
export async function createPublishedGuide(author: TestClient, moderator: TestClient, overrides: Record<string, unknown> = {}) {
  const { slug, revision } = await createDraftGuide(author, overrides);
  const submitted = await author.post(`/api/revisions/${revision.id}/submit`, { note: 'First version of the guide' });
  expect(submitted.status, JSON.stringify(submitted.body)).toBe(200);
  const published = await moderator.post(`/api/reviews/${revision.id}/publish`);
  expect(published.status, JSON.stringify(published.body)).toBe(200);
  return { slug, revisionId: revision.id as string };
}

/** Starts an edit of the live revision of a guide (or parameter, with `kind`). */
export async function proposeEdit(client: TestClient, slug: string, fields: Record<string, unknown> = {}, kind: 'guides' | 'parameters' = 'guides') {
  const live = await client.get(`/api/${kind}/${slug}/revisions`);
  const current = (live.body.data as Array<{ id: string; state: string }>).find((r) => r.state === 'published');
  const res = await client.post(`/api/${kind}/${slug}/revisions`, { baseRevisionId: current!.id, ...fields });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data.revision as { id: string; number: number; state: string; content: Record<string, unknown>; baseRevisionId: string };
}

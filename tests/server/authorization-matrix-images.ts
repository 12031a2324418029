import { expect } from 'vitest';
import type { Response } from 'supertest';
import type { TestClient } from '../setup/test-app';
import { createDraftGuide } from '../factories/guide';
import { buildPng, imageMarkdownFor, uploadImage } from '../factories/image';

// Owner scenarios of the image routes for the generated authorization matrix. An image in a draft is
// private: anyone but its uploader and the moderators is told 404, word for word as for an id never used.

type Who = 'visitor' | 'owner' | 'stranger' | 'moderator' | 'admin';
type W = { owner: { client: TestClient }; moderator: TestClient; admin: TestClient };
type Upload = { body: Buffer; name: string; type: string };
type A = { method: 'get' | 'post'; url: string; body?: unknown; id?: string; upload?: Upload; snapshot?: () => Promise<unknown> };
type E = { status: number; code?: string; check?: (res: Response, a: A, w: W) => unknown };
type S = { label: string; arrange: (w: W) => Promise<A>; expect: Partial<Record<Who, E>> };

const ok = (check?: E['check']): E => ({ status: 200, check });
const served = (status = 200): E => ({ status, check: (res) => expect(res.headers['content-type']).toBe('image/png') });

/** An image in the owner's own draft guide. */
async function draftImage(w: W) {
  const { revision } = await createDraftGuide(w.owner.client);
  return uploadImage(w.owner.client, revision.id, await buildPng(640, 360));
}

/** An image a live guide shows (a moderator published it). */
async function liveImage(w: W) {
  const { revision, slug } = await createDraftGuide(w.owner.client);
  const img = await uploadImage(w.owner.client, revision.id, await buildPng(640, 360));
  expect((await w.owner.client.patch(`/api/revisions/${revision.id}`, { body: imageMarkdownFor(img, 'Paper strip between pinion and spur') })).status).toBe(
    200,
  );
  expect((await w.owner.client.post(`/api/revisions/${revision.id}/submit`, { note: 'With a photo' })).status).toBe(200);
  expect((await w.moderator.post(`/api/reviews/${revision.id}/publish`)).status).toBe(200);
  return { ...img, slug };
}

export const imageScenarios: Record<string, S[]> = {
  'POST /api/revisions/:id/images': [
    {
      label: "an image into the owner's draft",
      arrange: async (w) => {
        const { revision } = await createDraftGuide(w.owner.client);
        return {
          method: 'post',
          url: `/api/revisions/${revision.id}/images`,
          id: revision.id,
          upload: { body: await buildPng(), name: 'mesh.png', type: 'image/png' },
          snapshot: async () => (await w.owner.client.get(`/api/revisions/${revision.id}`)).body,
        };
      },
      expect: { owner: { status: 201, check: (res) => expect(Object.keys(res.body.data).sort()).toEqual(['height', 'id', 'srcset', 'url', 'width']) } },
    },
  ],
  'GET /api/images/:id/:width': [
    {
      label: "an image in the owner's draft",
      arrange: async (w) => {
        const img = await draftImage(w);
        return { method: 'get', url: `/api/images/${img.id}/480`, id: img.id };
      },
      expect: { owner: served(), moderator: served(), admin: served() },
    },
    {
      label: 'an image a live guide shows',
      arrange: async (w) => {
        const img = await liveImage(w);
        return { method: 'get', url: `/api/images/${img.id}/480`, id: img.id };
      },
      expect: { owner: served(), moderator: served(), admin: served(), stranger: served(), visitor: served() },
    },
  ],
  'POST /api/images/:id/hide': [
    {
      label: "hiding the owner's live image (moderators only; each success is undone for the next caller)",
      arrange: async (w) => {
        const img = await liveImage(w);
        return { method: 'post', url: `/api/images/${img.id}/hide`, id: img.id, body: { reason: 'Not what the text describes' } };
      },
      expect: {
        owner: { status: 403, code: 'role_required' },
        ...Object.fromEntries(
          (['moderator', 'admin'] as const).map((who) => [
            who,
            ok(async (res, a, w) => {
              expect(res.body.data).toMatchObject({ id: a.id, hiddenReason: 'Not what the text describes' });
              expect((await w.owner.client.get(`/api/images/${a.id}/480`)).status).toBe(404);
              expect((await w.moderator.post(`/api/images/${a.id}/unhide`, {})).status).toBe(200);
            }),
          ]),
        ),
      },
    },
  ],
  'POST /api/images/:id/unhide': [
    {
      label: "showing the owner's hidden image again (moderators only; each success is undone for the next caller)",
      arrange: async (w) => {
        const img = await liveImage(w);
        expect((await w.moderator.post(`/api/images/${img.id}/hide`, { reason: 'Checking the matrix' })).status).toBe(200);
        return { method: 'post', url: `/api/images/${img.id}/unhide`, id: img.id, body: {} };
      },
      expect: {
        owner: { status: 403, code: 'role_required' },
        ...Object.fromEntries(
          (['moderator', 'admin'] as const).map((who) => [
            who,
            ok(async (res, a, w) => {
              expect(res.body.data).toMatchObject({ id: a.id, hiddenAt: null });
              expect((await w.owner.client.get(`/api/images/${a.id}/480`)).status).toBe(200);
              expect((await w.moderator.post(`/api/images/${a.id}/hide`, { reason: 'Checking the matrix' })).status).toBe(200);
            }),
          ]),
        ),
      },
    },
  ],
};

import { expect } from 'vitest';
import type { Response } from 'supertest';
import type { TestClient } from '../setup/test-app';
import { addCheck, buildCheck, createMotor } from '../factories/motor';

// Owner scenarios of the motor routes for the generated authorization matrix (motors are private:
// every caller but the owner is told 404, word for word as for an id never used).

type Who = 'visitor' | 'owner' | 'stranger' | 'moderator' | 'admin';
type W = { owner: { client: TestClient } };
type A = { method: 'get' | 'post' | 'patch' | 'delete'; url: string; body?: unknown; id?: string; snapshot?: () => Promise<unknown> };
type E = { status: number; code?: string; check?: (res: Response, a: A, w: W) => unknown };
type S = { label: string; arrange: (w: W) => Promise<A>; expect: Partial<Record<Who, E>> };

const ok = (check?: E['check']): E => ({ status: 200, check });
const motorOf = (w: W, id: string) => async () => ({
  motor: (await w.owner.client.get(`/api/motors/${id}`)).body,
  checks: (await w.owner.client.get(`/api/motors/${id}/checks`)).body,
});
const withCheck = async (w: W) => {
  const m = await createMotor(w.owner.client);
  const c = await addCheck(w.owner.client, m.id);
  return { id: m.id, checkId: c.id };
};

export const motorScenarios: Record<string, S[]> = {
  'GET /api/motors': [
    {
      label: "each caller's own motors only",
      arrange: async (w) => ({ method: 'get', url: '/api/motors', id: (await createMotor(w.owner.client)).id }),
      expect: Object.fromEntries(
        (['owner', 'stranger', 'moderator', 'admin'] as const).map((who) => [
          who,
          ok((res, a) =>
            expect(
              (res.body.data as Array<{ id: string }>).some((m) => m.id === a.id),
              who,
            ).toBe(who === 'owner'),
          ),
        ]),
      ),
    },
  ],
  'GET /api/motors/:id': [
    {
      label: "the owner's motor",
      arrange: async (w) => {
        const { id } = await createMotor(w.owner.client);
        return { method: 'get', url: `/api/motors/${id}`, id };
      },
      expect: { owner: ok((res, a) => expect(res.body.data.id).toBe(a.id)) },
    },
  ],
  'PATCH /api/motors/:id': [
    {
      label: "the owner's motor renamed",
      arrange: async (w) => {
        const { id } = await createMotor(w.owner.client);
        return { method: 'patch', url: `/api/motors/${id}`, body: { label: 'Renamed by someone' }, id, snapshot: motorOf(w, id) };
      },
      expect: { owner: ok((res) => expect(res.body.data.label).toBe('Renamed by someone')) },
    },
  ],
  'DELETE /api/motors/:id': [
    {
      label: "the owner's motor deleted",
      arrange: async (w) => {
        const { id } = await withCheck(w);
        return { method: 'delete', url: `/api/motors/${id}`, id, snapshot: motorOf(w, id) };
      },
      expect: { owner: { status: 204, check: async (_res, a, w) => expect((await w.owner.client.get(`/api/motors/${a.id}`)).status).toBe(404) } },
    },
  ],
  'POST /api/motors/:id/checks': [
    {
      label: "a check added to the owner's motor",
      arrange: async (w) => {
        const { id } = await createMotor(w.owner.client);
        return { method: 'post', url: `/api/motors/${id}/checks`, body: buildCheck(), id, snapshot: motorOf(w, id) };
      },
      expect: { owner: { status: 201, check: (res, a) => expect(res.body.data.motorId).toBe(a.id) } },
    },
  ],
  'GET /api/motors/:id/checks': [
    {
      label: "the owner's checks",
      arrange: async (w) => {
        const { id, checkId } = await withCheck(w);
        return { method: 'get', url: `/api/motors/${id}/checks`, id, checkId } as A & { checkId: string };
      },
      expect: { owner: ok((res, a) => expect(res.body.data[0].id).toBe((a as A & { checkId: string }).checkId)) },
    },
  ],
  'GET /api/motors/:id/checks.csv': [
    {
      label: "the owner's checks as CSV",
      arrange: async (w) => {
        const { id, checkId } = await withCheck(w);
        return { method: 'get', url: `/api/motors/${id}/checks.csv`, id, checkId } as A & { checkId: string };
      },
      expect: { owner: ok((res, a) => expect(res.text).toContain((a as A & { checkId: string }).checkId)) },
    },
  ],
  'DELETE /api/motors/:id/checks/:checkId': [
    {
      label: "one of the owner's checks deleted",
      arrange: async (w) => {
        const { id, checkId } = await withCheck(w);
        return { method: 'delete', url: `/api/motors/${id}/checks/${checkId}`, id, snapshot: motorOf(w, id) };
      },
      expect: { owner: { status: 204, check: async (_res, a, w) => expect((await w.owner.client.get(`/api/motors/${a.id}/checks`)).body.data).toEqual([]) } },
    },
  ],
  'GET /api/motors/:id/compare': [
    {
      label: "two of the owner's checks",
      arrange: async (w) => {
        const { id, checkId } = await withCheck(w);
        const second = await addCheck(w.owner.client, id, { noLoadRpm: 17_500 });
        return { method: 'get', url: `/api/motors/${id}/compare?from=${checkId}&to=${second.id}`, id };
      },
      expect: { owner: ok((res) => expect(res.body.data.quantities.length).toBeGreaterThan(5)) },
    },
  ],
};

import { expect } from 'vitest';
import { simulateRunCsv, type SimulationOptions } from '../../shared/runlog/simulate';
import type { TestClient } from '../setup/test-app';

/** Our own CSV from the simulator (invented data), short unless asked otherwise. */
export function buildRunCsv(opts: Partial<SimulationOptions> = {}): string {
  return simulateRunCsv({ seed: 7, durationS: 30, rateHz: 20, kvRpmPerV: 4000, cells: 2, capacityMah: 5000, ambientC: 20, ...opts });
}

export type RunUpload = { name?: string; body?: Buffer | string; contentType?: string; fields?: Record<string, string> };

/** A multipart POST to a run route on the client's session; wrapped, since a supertest request is thenable. */
export async function sendRun(client: TestClient, upload: RunUpload = {}, url = '/api/runs') {
  const token = (await client.agent.get('/api/csrf')).body.data.token as string;
  let req = client.agent.post(url).set('x-csrf-token', token);
  for (const [k, v] of Object.entries(upload.fields ?? {})) req = req.field(k, v);
  const body = upload.body ?? buildRunCsv();
  const name = upload.name ?? 'practice-run.csv';
  return { req: req.attach('file', typeof body === 'string' ? Buffer.from(body) : body, { filename: name, contentType: upload.contentType ?? 'text/csv' }) };
}

/** Uploads a run and returns its id (fails the test unless it was stored). */
export async function uploadRun(client: TestClient, upload: RunUpload = {}): Promise<string> {
  const res = await (await sendRun(client, upload)).req;
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data.id as string;
}

// Runs body diffs off the request thread (see body-diff-pool.ts): one message in, one message out.
import { parentPort } from 'node:worker_threads';
import { boundedBodyDiffSync } from './body-diff';

parentPort?.on('message', (msg: { id: number; from: string; to: string }) => {
  try {
    parentPort!.postMessage({ id: msg.id, ok: true, result: boundedBodyDiffSync(msg.from, msg.to) });
  } catch (err) {
    parentPort!.postMessage({ id: msg.id, ok: false, error: String((err as Error)?.message ?? err) });
  }
});

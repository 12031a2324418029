import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { freePort } from '../../server/bin/postgres.mjs';

export type AppProcess = {
  port: number;
  baseUrl: string;
  child: ChildProcess;
  /** The last lines the process printed (for failure messages). */
  output: () => string;
  /** SIGTERM, then SIGKILL after a grace period; resolves when the process has exited. */
  stop: () => Promise<void>;
  /** Sends a signal (e.g. SIGKILL to simulate a crash) and resolves when the process has exited. */
  kill: (signal: NodeJS.Signals) => Promise<void>;
};

const root = path.resolve(import.meta.dirname, '..', '..');

/**
 * The real entry point (server/index.ts) in a child process on a loopback port, as `npm start` runs it,
 * with the given environment on top of this process's. Resolves once GET /api/health answers.
 */
export async function startAppProcess(
  env: Record<string, string>,
  opts: {
    port?: number;
    readyTimeoutMs?: number;
    /** A compiled entry (dist-server/index.js) to run instead of the TypeScript one. */ compiledEntry?: string;
  } = {},
): Promise<AppProcess> {
  // freePort() only finds a port free for now; another test file's process can take it first. Then pick again.
  for (let attempt = 0; ; attempt++) {
    try {
      return await startOnce(env, opts.port ?? (await freePort()), opts.readyTimeoutMs, opts.compiledEntry);
    } catch (err) {
      if (opts.port !== undefined || attempt >= 3 || !/EADDRINUSE/.test((err as Error).message)) throw err;
    }
  }
}

async function startOnce(env: Record<string, string>, port: number, readyTimeoutMs?: number, compiledEntry?: string): Promise<AppProcess> {
  const args = compiledEntry ? ['--enable-source-maps', compiledEntry] : ['--import', 'tsx', path.join(root, 'server', 'index.ts')];
  const child = spawn(process.execPath, args, {
    cwd: root,
    env: { ...process.env, HOST: '127.0.0.1', PORT: String(port), ...(env.NODE_ENV === 'production' ? { DEV_TOOLS: 'false' } : {}), ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const lines: string[] = [];
  const keep = (chunk: Buffer) => {
    lines.push(...chunk.toString('utf8').split('\n').filter(Boolean));
    if (lines.length > 5000) lines.splice(0, lines.length - 5000);
  };
  child.stdout!.on('data', keep);
  child.stderr!.on('data', keep);
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const baseUrl = `http://127.0.0.1:${port}`;
  const output = () => lines.join('\n');

  const deadline = Date.now() + (readyTimeoutMs ?? 30_000);
  for (;;) {
    if (child.exitCode !== null) throw new Error(`app process exited with ${child.exitCode} before it was ready:\n${output()}`);
    try {
      const res = await fetch(`${baseUrl}/api/health`, { signal: AbortSignal.timeout(2000) });
      await res.arrayBuffer();
      // The answer must come from this child, not from another test's app that holds the same port.
      if (lines.some((l) => l.includes(`serving on ${baseUrl}`))) break;
      throw new Error('not this child yet');
    } catch {
      if (Date.now() > deadline) {
        child.kill('SIGKILL');
        throw new Error(`app process not ready within ${readyTimeoutMs ?? 30_000} ms:\n${output()}`);
      }
      await new Promise((r) => setTimeout(r, 100));
    }
  }

  const kill = async (signal: NodeJS.Signals) => {
    if (child.exitCode === null && child.signalCode === null) child.kill(signal);
    await exited;
  };
  return {
    port,
    baseUrl,
    child,
    output,
    kill,
    stop: async () => {
      const timer = setTimeout(() => child.kill('SIGKILL'), 8000);
      await kill('SIGTERM');
      clearTimeout(timer);
    },
  };
}

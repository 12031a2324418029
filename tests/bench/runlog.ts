// `npm run bench:runlog`: printed figures, not a timed test. A 60,000-row, 7-channel run from the simulator:
// server parse + validate + figures, figures alone and bytes stored per value in Node; then in Chromium the
// app's worker parse with main-thread long tasks, and the first draw and a cursor move with uPlot beside recharts.
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { build } from 'esbuild';
import { parseRunlog } from '../../shared/runlog/parse';
import { computeRunFigures } from '../../shared/runlog/figures';
import { encodeColumnar } from '../../shared/runlog/columnar';
import { simulateRunCsv } from '../../shared/runlog/simulate';
import { crossCorrelationOffset } from '../../shared/runlog/align';
import { launchBrowser } from '../setup/browser';

const ROWS = 60_000;
const REPEATS = Number(process.env.BENCH_RUNS ?? 5);
const root = path.resolve(import.meta.dirname, '..', '..');
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const ms = (x: number) => `${x.toFixed(1)} ms`;

function time<T>(f: () => T): [T, number] {
  const t0 = performance.now();
  const v = f();
  return [v, performance.now() - t0];
}

async function main() {
  console.log(
    `[bench:runlog] load average ${os
      .loadavg()
      .map((l) => l.toFixed(2))
      .join(' ')} on ${os.cpus().length} cores`,
  );
  const csv = simulateRunCsv({ seed: 3, durationS: (ROWS - 1) / 100, rateHz: 100, kvRpmPerV: 4000, cells: 2, capacityMah: 5000, ambientC: 20 });
  console.log(`[bench:runlog] ${ROWS.toLocaleString('en-GB')} rows × 7 channels, ${(csv.length / 1024 / 1024).toFixed(2)} MB of CSV`);

  const parseTimes: number[] = [];
  const figureTimes: number[] = [];
  let stored = 0;
  let values = 0;
  for (let i = 0; i < REPEATS; i++) {
    const [parsed, tParse] = time(() => parseRunlog(csv));
    if (!parsed.ok) throw new Error(JSON.stringify(parsed.problem));
    const [, tFig] = time(() => computeRunFigures(parsed.run.time, parsed.run.channels, parsed.run.gaps, { battery: { chemistry: 'lipo', cells: 2 } }));
    parseTimes.push(tParse + tFig);
    figureTimes.push(tFig);
    const bytes = encodeColumnar(parsed.run.time, parsed.run.channels);
    stored = bytes.byteLength;
    values = parsed.run.time.length * (Object.keys(parsed.run.channels).length + 1);
  }
  console.log(`server parse + validate + figures: median ${ms(median(parseTimes))} of ${REPEATS}`);
  console.log(`figures alone: median ${ms(median(figureTimes))}`);
  // Compare's alignment: two 60,000-row runs, the second idling 1.5 s longer, matched by cross-correlation of the throttle.
  const second = parseRunlog(
    simulateRunCsv({ seed: 5, durationS: (ROWS - 1) / 100, rateHz: 100, kvRpmPerV: 4000, cells: 2, capacityMah: 5000, ambientC: 20, idleS: 3.5 }),
  );
  const first = parseRunlog(csv);
  if (!second.ok || !first.ok) throw new Error('simulated runs must parse');
  const alignTimes: number[] = [];
  let offset = NaN;
  for (let i = 0; i < REPEATS; i++) {
    const [found, t] = time(() =>
      crossCorrelationOffset(
        { time: first.run.time, values: first.run.channels.throttle_pct! },
        { time: second.run.time, values: second.run.channels.throttle_pct! },
      ),
    );
    alignTimes.push(t);
    offset = found?.offsetS ?? NaN;
  }
  console.log(
    `compare alignment (cross-correlation, 2 × ${ROWS.toLocaleString('en-GB')} rows): median ${ms(median(alignTimes))}, offset ${offset.toFixed(2)} s (expected 1.50)`,
  );
  console.log(
    `stored columns: ${stored.toLocaleString('en-GB')} bytes for ${values.toLocaleString('en-GB')} values = ${(stored / values).toFixed(3)} bytes per sample value (goal ≤ 4)`,
  );

  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tw-bench-runlog-'));
  const server = http.createServer((req, res) => {
    const file = path.join(dir, path.basename(req.url === '/' ? 'index.html' : (req.url ?? '')));
    if (!fs.existsSync(file)) return void res.writeHead(404).end();
    res
      .writeHead(200, { 'content-type': file.endsWith('.js') ? 'text/javascript' : file.endsWith('.css') ? 'text/css' : 'text/html' })
      .end(fs.readFileSync(file));
  });
  const browser = await launchBrowser();
  try {
    await build({
      entryPoints: { page: path.join(root, 'tests/bench/runlog-page.tsx'), worker: path.join(root, 'src/features/runs/workers/parse.worker.ts') },
      bundle: true,
      format: 'esm',
      outdir: dir,
      minify: true,
      jsx: 'automatic',
      alias: { '@shared': path.join(root, 'shared'), '@': path.join(root, 'src') },
      define: { 'process.env.NODE_ENV': '"production"' },
      logLevel: 'warning',
    });
    fs.writeFileSync(
      path.join(dir, 'index.html'),
      '<!doctype html><link rel="stylesheet" href="page.css"><body><script type="module" src="page.js"></script></body>',
    );
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    const port = (server.address() as { port: number }).port;
    const page = await browser.newPage({ viewport: { width: 1300, height: 900 } });
    await page.goto(`http://127.0.0.1:${port}/`);
    await page.waitForFunction(() => typeof window.runBench === 'function');
    const parsed = parseRunlog(csv);
    if (!parsed.ok) throw new Error('parse');
    const data = [Array.from(parsed.run.time), ...Object.values(parsed.run.channels).map((c) => Array.from(c!))];
    const r = await page.evaluate(([text, d]) => window.runBench(text, d), [csv, data] as const);
    console.log(
      `browser worker parse: ${ms(r.workerParseMs)} in the worker (${ms(r.workerRoundTripMs)} round trip); main-thread long tasks over 50 ms while parsing: ${r.longTasksOver50} (longest ${ms(r.longestTaskMs)})`,
    );
    console.log(
      `chart, ${data.length - 1} channels × ${ROWS.toLocaleString('en-GB')} points on one time axis: uPlot first draw ${ms(r.uplotDrawMs)}, cursor move ${ms(r.uplotCursorMs)}`,
    );
    console.log(`                            recharts first draw ${ms(r.rechartsDrawMs)}, cursor move ${ms(r.rechartsCursorMs)}`);
    console.log(
      `ratio recharts / uPlot: first draw ${(r.rechartsDrawMs / r.uplotDrawMs).toFixed(1)}×, cursor ${(r.rechartsCursorMs / Math.max(0.1, r.uplotCursorMs)).toFixed(1)}× (goal ≥ 10×)`,
    );
  } finally {
    await browser.close();
    server.close();
    fs.rmSync(dir, { recursive: true, force: true });
  }
  console.log(
    `[bench:runlog] load average after ${os
      .loadavg()
      .map((l) => l.toFixed(2))
      .join(' ')}`,
  );
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});

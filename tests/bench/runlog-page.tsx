// Browser half of `npm run bench:runlog` (bundled by esbuild there): draws every channel's N points with uPlot and with
// recharts, moves the cursor on each, and parses a CSV in the app's worker while watching for long tasks.
import { createRoot } from 'react-dom/client';
import { flushSync } from 'react-dom';
import { LineChart, Line, XAxis, YAxis, Tooltip } from 'recharts';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';

type Result = Record<string, number>;

function waitFrames(n = 2) {
  return new Promise<void>((r) => {
    const step = (k: number) => (k === 0 ? r() : requestAnimationFrame(() => step(k - 1)));
    step(n);
  });
}

async function benchUplot(data: number[][]): Promise<Result> {
  const CHANNELS = data.length - 1;
  const el = document.createElement('div');
  document.body.append(el);
  const t0 = performance.now();
  const u = new uPlot(
    {
      width: 1200,
      height: 600,
      series: [{}, ...Array.from({ length: CHANNELS }, (_v, i) => ({ stroke: `hsl(${i * 50} 60% 40%)` }))],
      scales: { x: { time: false } },
    },
    data as uPlot.AlignedData,
    el,
  );
  // uPlot finishes its first paint in a microtask; count up to the next frame, as for recharts.
  await waitFrames(1);
  const draw = performance.now() - t0;
  await waitFrames();
  const t1 = performance.now();
  u.setCursor({ left: 600, top: 300 });
  await waitFrames(1);
  const cursor = performance.now() - t1;
  u.destroy();
  el.remove();
  return { uplotDrawMs: draw, uplotCursorMs: cursor };
}

async function benchRecharts(data: number[][]): Promise<Result> {
  const CHANNELS = data.length - 1;
  const el = document.createElement('div');
  document.body.append(el);
  const rows = data[0].map((t, i) => Object.fromEntries([['t', t], ...Array.from({ length: CHANNELS }, (_v, k) => [`c${k}`, data[k + 1][i]])]));
  const root = createRoot(el);
  const t0 = performance.now();
  flushSync(() =>
    root.render(
      <LineChart width={1200} height={600} data={rows}>
        <XAxis dataKey="t" type="number" />
        <YAxis />
        <Tooltip isAnimationActive={false} />
        {Array.from({ length: CHANNELS }, (_v, k) => (
          <Line key={k} dataKey={`c${k}`} dot={false} isAnimationActive={false} stroke={`hsl(${k * 50} 60% 40%)`} />
        ))}
      </LineChart>,
    ),
  );
  await waitFrames(1);
  const draw = performance.now() - t0;
  const surface = el.querySelector('svg')!;
  const r = surface.getBoundingClientRect();
  const t1 = performance.now();
  surface.dispatchEvent(new MouseEvent('mousemove', { bubbles: true, clientX: r.left + 600, clientY: r.top + 300 }));
  await waitFrames(1);
  const cursor = performance.now() - t1;
  root.unmount();
  el.remove();
  return { rechartsDrawMs: draw, rechartsCursorMs: cursor };
}

async function benchWorker(csv: string): Promise<Result> {
  const longTasks: number[] = [];
  const obs = new PerformanceObserver((list) => list.getEntries().forEach((e) => longTasks.push(e.duration)));
  obs.observe({ type: 'longtask', buffered: false });
  const worker = new Worker('./worker.js', { type: 'module' });
  const file = new File([csv], 'bench.csv', { type: 'text/csv' });
  const t0 = performance.now();
  const parseMs = await new Promise<number>((resolve) => {
    worker.onmessage = (e) => resolve((e.data as { parseMs: number }).parseMs);
    worker.postMessage({ file });
  });
  const total = performance.now() - t0;
  await waitFrames();
  obs.disconnect();
  worker.terminate();
  return {
    workerParseMs: parseMs,
    workerRoundTripMs: total,
    longTasksOver50: longTasks.filter((d) => d > 50).length,
    longestTaskMs: Math.max(0, ...longTasks),
  };
}

declare global {
  interface Window {
    runBench: (csv: string, data: number[][]) => Promise<Result>;
  }
}
window.runBench = async (csv, data) => ({ ...(await benchWorker(csv)), ...(await benchUplot(data)), ...(await benchRecharts(data)) });

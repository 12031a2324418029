import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';

/** A tiny React wrapper: one uPlot per mount, its width following the container, destroyed on unmount. */
export function UPlotChart({
  options,
  data,
  onCreate,
  className = '',
}: {
  options: Omit<uPlot.Options, 'width'>;
  data: uPlot.AlignedData;
  onCreate?: (u: uPlot) => () => void;
  className?: string;
}) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const chart = new uPlot({ ...options, width: Math.max(200, el.clientWidth) } as uPlot.Options, data, el);
    const cleanup = onCreate?.(chart);
    const ro = new ResizeObserver(() => chart.setSize({ width: Math.max(200, el.clientWidth), height: options.height }));
    ro.observe(el);
    return () => {
      ro.disconnect();
      cleanup?.();
      chart.destroy();
    };
    // Options and data are rebuilt only when the run or its offset changes (memoised by the caller).
  }, [options, data, onCreate]);
  return <div ref={box} className={className} />;
}

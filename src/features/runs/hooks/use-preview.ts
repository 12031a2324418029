import { useCallback, useEffect, useRef, useState } from 'react';
import type { RunMapping } from '@shared/runlog/mapping';
import type { WorkerPreview } from '../workers/parse.worker';

/** Parses a chosen file in a Web Worker (the page stays responsive) and returns its preview. */
export function useRunPreview() {
  const worker = useRef<Worker | null>(null);
  const [preview, setPreview] = useState<WorkerPreview | null>(null);
  const [pending, setPending] = useState(false);

  useEffect(() => () => worker.current?.terminate(), []);

  const run = useCallback((file: File, mapping?: RunMapping) => {
    worker.current ??= new Worker(new URL('../workers/parse.worker.ts', import.meta.url), { type: 'module' });
    setPending(true);
    worker.current.onmessage = (e: MessageEvent<WorkerPreview>) => {
      setPreview(e.data);
      setPending(false);
    };
    worker.current.postMessage({ file, mapping });
  }, []);

  return { preview, pending, run, clear: () => setPreview(null) };
}

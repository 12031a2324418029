/// <reference lib="webworker" />
import { proposeMapping, type RunMapping } from '@shared/runlog/mapping';
import { parseTable } from '@shared/runlog/parse';
import { readTable } from '@shared/runlog/table';
import { computeRunFigures } from '@shared/runlog/figures';
import { RUNLOG_LIMITS } from '@shared/runlog/vocabulary';

export type PreviewRequest = { file: File; mapping?: RunMapping };
export type WorkerPreview = {
  headers: string[];
  rows: string[][];
  rowCount: number;
  mapping: Partial<RunMapping>;
  ours: boolean;
  notes: Array<{ code: string; message: string }>;
  problem: { code: string; message: string; row?: number; column?: string } | null;
  summary: ReturnType<typeof computeRunFigures> | null;
  parseMs: number;
};

// Parsing runs here so the page never freezes on a long log: the same shared parser the server uses.
self.onmessage = async (e: MessageEvent<PreviewRequest>) => {
  const started = performance.now();
  try {
    const text = await e.data.file.text();
    const read = readTable(text);
    if (!read.ok) {
      self.postMessage({
        headers: [],
        rows: [],
        rowCount: 0,
        mapping: {},
        ours: false,
        notes: [],
        problem: read.problem,
        summary: null,
        parseMs: performance.now() - started,
      } satisfies WorkerPreview);
      return;
    }
    const proposal = proposeMapping(read.table.headers);
    const parsed = parseTable(read.table, e.data.mapping);
    self.postMessage({
      headers: read.table.headers,
      rows: read.table.rows.slice(0, RUNLOG_LIMITS.previewRows),
      rowCount: read.table.rows.length,
      mapping: e.data.mapping ?? (parsed.ok ? parsed.run.mapping : proposal.mapping),
      ours: proposal.ours,
      notes: parsed.ok ? parsed.run.notes : read.table.notes,
      problem: parsed.ok ? null : parsed.problem,
      summary: parsed.ok ? computeRunFigures(parsed.run.time, parsed.run.channels, parsed.run.gaps) : null,
      parseMs: performance.now() - started,
    } satisfies WorkerPreview);
  } catch (err) {
    self.postMessage({
      headers: [],
      rows: [],
      rowCount: 0,
      mapping: {},
      ours: false,
      notes: [],
      problem: { code: 'unreadable', message: err instanceof Error ? err.message : 'The file could not be read.' },
      summary: null,
      parseMs: 0,
    } satisfies WorkerPreview);
  }
};

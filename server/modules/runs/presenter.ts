import type { Run, RunListItem, RunSummary } from '../../../shared/schemas/run';
import type { RunChannel } from '../../../shared/runlog/vocabulary';
import type { RunEntity } from './run.entity';

/** A run as the API answers it; the setup's name only for its owner. */
export function presentRun(row: RunEntity, labels: Map<string, string>, user: { id: string } | null): Run {
  const own = !!user && user.id === row.ownerId;
  return {
    id: row.id,
    title: row.title,
    originalName: own ? row.originalName : `${row.title}.csv`,
    byteSize: row.byteSize,
    createdAt: row.createdAt.toISOString(),
    setupId: own ? row.setupId : null,
    setupLabel: own && row.setupId ? (labels.get(row.setupId) ?? null) : null,
    demo: row.demo,
    channels: row.channels as RunChannel[],
    mapping: row.mapping,
    importNotes: row.importNotes,
    gaps: row.gaps,
    summary: row.summary as RunSummary,
    isOwn: own,
  };
}

export function presentRunListItem(row: RunEntity, labels: Map<string, string>, user: { id: string } | null): RunListItem {
  const { mapping: _m, importNotes: _n, gaps: _g, ...rest } = presentRun(row, labels, user);
  return rest;
}

import type { Run, RunGearing, RunListItem, RunSummary } from '../../../shared/schemas/run';
import type { RunChannel } from '../../../shared/runlog/vocabulary';
import type { RunEntity } from './run.entity';

/** Names (and the gearing) of the setups and motors a list of runs points at; see `runLabels` in the service. */
export type RunLabels = { setups: Map<string, { label: string; gearing: RunGearing }>; motors: Map<string, string> };

/** A run as the API answers it; the setup, its gearing and the motor only for its owner (they are private). */
export function presentRun(row: RunEntity, labels: RunLabels, user: { id: string } | null): Run {
  const own = !!user && user.id === row.ownerId;
  const setup = own && row.setupId ? labels.setups.get(row.setupId) : undefined;
  return {
    id: row.id,
    title: row.title,
    originalName: own ? row.originalName : `${row.title}.csv`,
    byteSize: row.byteSize,
    createdAt: row.createdAt.toISOString(),
    setupId: own ? row.setupId : null,
    setupLabel: setup?.label ?? null,
    gearing: setup?.gearing ?? null,
    motorId: own ? row.motorId : null,
    motorLabel: own && row.motorId ? (labels.motors.get(row.motorId) ?? null) : null,
    demo: row.demo,
    channels: row.channels as RunChannel[],
    mapping: row.mapping,
    importNotes: row.importNotes,
    gaps: row.gaps,
    summary: row.summary as RunSummary,
    isOwn: own,
  };
}

export function presentRunListItem(row: RunEntity, labels: RunLabels, user: { id: string } | null): RunListItem {
  const { mapping: _m, importNotes: _n, gaps: _g, ...rest } = presentRun(row, labels, user);
  return rest;
}

/** One run in an evidence comparison: kept from the live version, added by the proposal, or taken off by it. */
export type EvidenceChange<T> = { run: T; change: 'kept' | 'added' | 'removed' };

/**
 * The evidence a proposal carries against the live version's, by run id: the proposal's runs in their order
 * (each kept or added), then the live runs it no longer carries (removed). With no live version, all are added.
 */
export function evidenceDiff<T extends { id: string }>(proposed: readonly T[], live: readonly T[] | null): Array<EvidenceChange<T>> {
  const liveIds = new Set((live ?? []).map((r) => r.id));
  const proposedIds = new Set(proposed.map((r) => r.id));
  return [
    ...proposed.map((run) => ({ run, change: liveIds.has(run.id) ? ('kept' as const) : ('added' as const) })),
    ...(live ?? []).filter((r) => !proposedIds.has(r.id)).map((run) => ({ run, change: 'removed' as const })),
  ];
}

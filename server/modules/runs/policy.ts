import type { DataSource, EntityManager } from 'typeorm';

/**
 * Runs are private: only their owner reads them. A run offered as evidence becomes readable by anyone once the
 * guide revision it is attached to is live (published) on a visible guide, never earlier.
 */
export async function canReadRun(db: DataSource | EntityManager, user: { id: string } | null, row: { id: string; ownerId: string }): Promise<boolean> {
  if (user && user.id === row.ownerId) return true;
  return isPublicEvidence(db, row.id);
}

/** True when the run is evidence on the live revision of a visible guide. */
export async function isPublicEvidence(db: DataSource | EntityManager, runId: string): Promise<boolean> {
  const rows: unknown[] = await db.query(
    `SELECT 1 FROM run_evidence e JOIN documents d ON d.published_revision_id = e.revision_id
      WHERE e.run_id = $1 AND d.hidden_at IS NULL LIMIT 1`,
    [runId],
  );
  return rows.length > 0;
}

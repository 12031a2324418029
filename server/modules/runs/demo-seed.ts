import type { DataSource } from 'typeorm';
import { computeRunFigures } from '../../../shared/runlog/figures';
import { encodeColumnar } from '../../../shared/runlog/columnar';
import { parseRunlog } from '../../../shared/runlog/parse';
import { simulateRunCsv } from '../../../shared/runlog/simulate';
import { VALUE_CHANNELS } from '../../../shared/runlog/vocabulary';
import type { SetupRecord } from '../../../shared/schemas/setup-record';
import type { Logger } from '../../lib/logger';
import type { Storage } from '../../lib/storage';
import { contextOf, storeRun } from './service';
import { RunEntity } from './run.entity';

/** Marks every simulated run's title, so nobody takes it for a real car. */
export const DEMO_RUN_PREFIX = 'Invented demo run';

/**
 * Gives each live demo guide with a baseline one simulated run (invented data, flagged `demo`), owned by the
 * live revision's author and offered as evidence on it. Idempotent: a guide whose live revision already has a
 * demo run is left alone. Returns how many runs were made.
 */
export async function seedDemoRuns(dataSource: DataSource, storage: Storage, logger: Logger): Promise<number> {
  const live: Array<{ slug: string; revision_id: string; author_id: string; setup: SetupRecord; title: string }> = await dataSource.query(
    `SELECT d.slug, r.id AS revision_id, r.author_id, r.setup, r.content->>'title' AS title
       FROM documents d JOIN revisions r ON r.id = d.published_revision_id
      WHERE d.kind = 'guide' AND d.hidden_at IS NULL AND r.setup IS NOT NULL
        AND NOT EXISTS (SELECT 1 FROM run_evidence e JOIN runs x ON x.id = e.run_id WHERE e.revision_id = r.id AND x.demo)
      ORDER BY d.slug`,
  );
  let made = 0;
  for (const [i, g] of live.entries()) {
    const kv = g.setup.motor.kvRpmPerV ?? 3000;
    const csv = simulateRunCsv({
      seed: 1000 + i,
      durationS: 180,
      rateHz: 50,
      kvRpmPerV: kv,
      cells: g.setup.battery.cells,
      capacityMah: g.setup.battery.capacityMah ?? 5000,
      ambientC: g.setup.conditions.ambientTempC ?? 20,
    });
    const parsed = parseRunlog(csv);
    if (!parsed.ok) throw new Error(`the simulator wrote a run the parser refuses: ${JSON.stringify(parsed.problem)}`);
    const { run } = parsed;
    const summary = computeRunFigures(run.time, run.channels, run.gaps, contextOf(g.setup));
    await dataSource.transaction(async (m) => {
      const row: RunEntity = await storeRun(
        { storage, dataSource, logger },
        {
          ownerId: g.author_id,
          setupId: null,
          motorId: null,
          title: `${DEMO_RUN_PREFIX}: ${String(g.title).slice(0, 90)}`,
          originalName: `${g.slug.slice(0, 100)}-demo.csv`,
          raw: Buffer.from(csv),
          data: encodeColumnar(run.time, run.channels),
          channels: ['time_s', ...VALUE_CHANNELS.filter((c) => run.channels[c])],
          mapping: run.mapping,
          importNotes: [{ code: 'demo', message: 'Invented by Tunewright’s run simulator for the demo guides: not a logged run of a real car.' }, ...run.notes],
          gaps: run.gaps,
          summary,
          demo: true,
        },
        m,
      );
      await m.query('INSERT INTO run_evidence (revision_id, run_id) VALUES ($1, $2)', [g.revision_id, row.id]);
    });
    made++;
  }
  return made;
}

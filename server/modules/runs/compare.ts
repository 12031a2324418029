import type { RunSummary, RunCompare } from '../../../shared/schemas/run';
import type { SetupRecord } from '../../../shared/schemas/setup-record';
import { diffSetupFields } from '../../../shared/setup/compare';
import type { AppContext } from '../../context';
import { SetupEntity } from '../setups/setup.entity';
import { loadSettingLibrary, namesOf } from '../setups/service';
import { presentRunListItem } from './presenter';
import { alignRuns, getRun, runLabels } from './service';

/** The figures compared side by side, in the order the screen lists them. */
export const COMPARED_FIGURES = [
  'durationS',
  'peakRpm',
  'topSpeedKmh',
  'fullThrottleShare',
  'peakCurrentA',
  'meanCurrentA',
  'energyMah',
  'energyWh',
  'maxMotorTempC',
  'maxEscTempC',
  'restPackV',
  'minPackV',
  'minCellV',
  'sampleRateHz',
] as const satisfies ReadonlyArray<keyof RunSummary>;

/**
 * Two runs side by side: figures with b − a, the offset that lines b up on a (see {@link alignRuns}: by
 * cross-correlation of a trace both runs have, else their first sustained full throttle, else their starts), and
 * the setup fields that differ when both runs are attached to setups of the caller's own.
 */
export async function compareRuns(ctx: AppContext, user: { id: string } | null, aId: string, bId: string): Promise<RunCompare> {
  const [a, b] = [await getRun(ctx.dataSource, user, aId), await getRun(ctx.dataSource, user, bId)];
  const labels = await runLabels(ctx.dataSource, [a, b]);
  const sa = a.summary as RunSummary;
  const sb = b.summary as RunSummary;
  const differences = COMPARED_FIGURES.map((key) => {
    const va = sa[key] as number | null;
    const vb = sb[key] as number | null;
    return { key, a: va, b: vb, delta: va !== null && vb !== null ? vb - va : null };
  });
  const alignment = await alignRuns(ctx, a, b);

  let settings: RunCompare['settings'] = [];
  let settingsNote: string | null = null;
  const setups =
    user && a.setupId && b.setupId
      ? await ctx.dataSource.getRepository(SetupEntity).findBy([
          { id: a.setupId, ownerId: user.id },
          { id: b.setupId, ownerId: user.id },
        ])
      : [];
  const recA = setups.find((s) => s.id === a.setupId)?.record as SetupRecord | undefined;
  const recB = setups.find((s) => s.id === b.setupId)?.record as SetupRecord | undefined;
  if (recA && recB) {
    const names = namesOf(await loadSettingLibrary(ctx.dataSource));
    settings = diffSetupFields(recA, recB, { names })
      .filter((d) => d.changed)
      .map((d) => ({ path: d.path, label: d.label, unit: d.unit, a: d.a, b: d.b }));
    if (!settings.length) settingsNote = 'Both runs use setups with the same settings.';
  } else {
    settingsNote = 'Attach both runs to setups of your own to see which settings differ.';
  }
  return { a: presentRunListItem(a, labels, user), b: presentRunListItem(b, labels, user), differences, alignment, settings, settingsNote };
}

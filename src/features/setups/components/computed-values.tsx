import type { SetupComputed } from '@shared/setup/computed';
import { formatQuantity, formatRatio } from '@shared/units';
import { useUnits } from '@/lib/preferences';
import { fmt } from './labels';

/** The key computed values of a record as a compact definition list. */
export function ComputedValues({ computed, dense = false }: { computed: SetupComputed; dense?: boolean }) {
  const { gearing, pack, motor, speed, timing } = computed;
  const units = useUnits();
  const other = units === 'metric' ? 'imperial' : 'metric';
  const items: [string, string, string?][] = [
    ['Final drive ratio', gearing ? formatRatio(gearing.finalDriveRatio) : '—'],
    [
      'Rollout',
      gearing ? formatQuantity('rollout', gearing.rolloutMm, units) : '—',
      gearing ? `${formatQuantity('rollout', gearing.rolloutMm, other)} per motor turn` : undefined,
    ],
    ['No-load motor speed', motor ? `${fmt(motor.noLoadRpm, 0)} rpm` : '—', motor ? `at ${fmt(motor.volts)} V nominal` : 'needs the motor kV'],
    [
      'Estimated top speed',
      speed ? formatQuantity('speed', speed.loadedKmh, units) : '—',
      speed ? `${formatQuantity('speed', speed.loadedKmh, other)}; ${Math.round(speed.loadFactor * 100)} % of no-load rpm` : undefined,
    ],
    ['Pack', pack ? `${fmt(pack.fullV)} V full · ${fmt(pack.nominalV)} V nominal` : '—', pack?.storageV ? `storage ${fmt(pack.storageV)} V` : undefined],
    [
      'Low-voltage cutoff',
      pack?.cutoffV ? `${fmt(pack.cutoffV)} V (${fmt(pack.cutoffPerCellV)} V per cell)` : 'not set',
      pack ? `usual window ${fmt(pack.cutoffWindowPerCellV.min)}–${fmt(pack.cutoffWindowPerCellV.max)} V per cell` : undefined,
    ],
    [
      'Total timing',
      timing ? `${fmt(timing.totalDeg, 1)}°` : '—',
      timing ? `at ${fmt(timing.atRpm, 0)} rpm: ${fmt(timing.controllerDeg, 1)}° controller + ${fmt(timing.endbellElectricalDeg, 1)}° endbell` : undefined,
    ],
  ];
  return (
    <dl className={`grid gap-x-6 ${dense ? 'gap-y-1 sm:grid-cols-2' : 'gap-y-3 sm:grid-cols-2 lg:grid-cols-3'}`} data-testid="computed-values">
      {items.map(([label, value, hint]) => (
        <div key={label} className="min-w-0">
          <dt className="text-xs font-semibold tracking-wide text-ink-muted uppercase">{label}</dt>
          <dd className="font-medium text-ink tabular-nums">{value}</dd>
          {hint && <dd className="text-xs text-ink-muted">{hint}</dd>}
        </div>
      ))}
    </dl>
  );
}

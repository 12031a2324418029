import type { CalculatorName } from '@shared/calc/registry';
import { formatQuantity, formatRatio, type UnitSystem } from '@shared/units';

/** One line of a result list; `primary` lines are shown large. */
export type ResultLine = { key: string; label: string; value: string; note?: string; primary?: boolean };

type R = Record<string, unknown>;

const num = (v: unknown, digits = 2) => (typeof v === 'number' && Number.isFinite(v) ? v.toLocaleString('en-GB', { maximumFractionDigits: digits }) : '—');
/** Volts read to the hundredth, as chargers and checkers show them (8.40 V, not 8.4 V). */
const volts = (v: unknown) =>
  typeof v === 'number' && Number.isFinite(v) ? v.toLocaleString('en-GB', { minimumFractionDigits: 2, maximumFractionDigits: 2 }) : '—';
const has = (r: R, k: string) => typeof r[k] === 'number';

const BAND_LABELS: Record<string, string> = { cool: 'Cool', warm: 'Warm', hot: 'Hot', 'too-hot': 'Too hot' };
const PART_LABELS: Record<string, string> = { motor: 'motor', esc: 'speed controller', pack: 'pack' };
const CHECK_LABELS: Record<string, string> = {
  'below-window': 'below the usual window',
  'in-window': 'inside the usual window',
  'above-window': 'above the usual window',
};

const len = (v: unknown, units: UnitSystem, q: 'length' | 'rollout' = 'length') => formatQuantity(q, typeof v === 'number' ? v : null, units);
const speed = (v: unknown, units: UnitSystem) => formatQuantity('speed', typeof v === 'number' ? v : null, units);
const temp = (v: unknown, units: UnitSystem, digits = 1) => formatQuantity('temperature', typeof v === 'number' ? v : null, units, digits);
const ratio = (v: unknown) => formatRatio(typeof v === 'number' ? v : null);

/**
 * The results worth reading, labelled with units, per calculator (inputs help phrase a few of them).
 * Lengths, speeds and temperatures follow the person's display units (#17); calculators compute in SI.
 */
export function resultLines(name: CalculatorName, r: R, inputs: Record<string, string>, units: UnitSystem = 'metric'): ResultLine[] {
  const other: UnitSystem = units === 'metric' ? 'imperial' : 'metric';
  switch (name) {
    case 'gearing':
      return [
        { key: 'finalDriveRatio', label: 'Final drive ratio', value: ratio(r.finalDriveRatio), primary: true },
        {
          key: 'rolloutMm',
          label: 'Rollout',
          value: len(r.rolloutMm, units, 'rollout'),
          note: `${len(r.rolloutMm, other, 'rollout')} per motor turn`,
          primary: true,
        },
        {
          key: 'kmhPer1000Rpm',
          label: 'Speed per 1,000 motor rpm',
          value: formatQuantity('speed', typeof r.kmhPer1000Rpm === 'number' ? r.kmhPer1000Rpm : null, units, 2),
        },
        { key: 'tyreCircumferenceMm', label: 'Tyre circumference', value: len(r.tyreCircumferenceMm, units) },
      ];
    case 'motor':
      return [
        { key: 'noLoadRpm', label: 'No-load speed', value: `${num(r.noLoadRpm, 0)} rpm`, primary: true },
        { key: 'ktNmPerA', label: 'Torque constant', value: `${num(r.ktNmPerA, 6)} N·m/A`, primary: true },
        { key: 'electricalRpm', label: 'Electrical speed', value: `${num(r.electricalRpm, 0)} rpm`, note: `${num(r.polePairs, 0)} pole pair(s)` },
        { key: 'electricalHz', label: 'Commutation frequency', value: `${num(r.electricalHz, 1)} Hz` },
      ];
    case 'top-speed':
      return [
        {
          key: 'loadedKmh',
          label: 'Estimated top speed',
          value: speed(r.loadedKmh, units),
          note: `${speed(r.loadedKmh, other)} at ${num(r.loadedRpm, 0)} rpm`,
          primary: true,
        },
        {
          key: 'noLoadKmh',
          label: 'No-load speed',
          value: speed(r.noLoadKmh, units),
          note: `${speed(r.noLoadKmh, other)} at ${num(r.noLoadRpm, 0)} rpm`,
        },
        { key: 'finalDriveRatio', label: 'Final drive ratio', value: ratio(r.finalDriveRatio) },
      ];
    case 'timing-curve': {
      const lines: ResultLine[] = [];
      if (has(r, 'totalDegAt')) {
        lines.push({ key: 'totalDegAt', label: `Timing at ${num(Number(inputs.atRpm), 0)} rpm`, value: `${num(r.totalDegAt, 1)}°`, primary: true });
        if (Number(r.stepDeg) > 0) {
          lines.push({
            key: 'totalDegAtFullThrottle',
            label: 'Same speed, full throttle held',
            value: `${num(r.totalDegAtFullThrottle, 1)}°`,
            note: `after ${num(r.stepDelayS ?? 0, 2)} s`,
          });
        }
      }
      lines.push({ key: 'maxTotalDeg', label: 'Most the controller adds', value: `${num(r.maxTotalDeg, 1)}°`, primary: !has(r, 'totalDegAt') });
      if (has(r, 'endbellElectricalDeg')) {
        lines.push({ key: 'endbellElectricalDeg', label: 'Endbell timing, electrical', value: `${num(r.endbellElectricalDeg, 1)}°` });
        lines.push({ key: 'maxCombinedDeg', label: 'Controller + endbell, at most', value: `${num(r.maxCombinedDeg, 1)}°` });
      }
      return lines;
    }
    case 'pack': {
      const window = r.cutoffWindowV as { min: number; max: number };
      const perCell = r.perCell as { cutoffWindowV: { min: number; max: number } };
      const lines: ResultLine[] = [
        { key: 'fullV', label: 'Full charge', value: `${volts(r.fullV)} V`, primary: true },
        { key: 'nominalV', label: 'Nominal', value: `${volts(r.nominalV)} V`, primary: true },
        { key: 'storageV', label: 'Storage', value: r.storageV === null ? 'no voltage target' : `${volts(r.storageV)} V` },
        {
          key: 'cutoffWindowV',
          label: 'Usual cutoff window',
          value: `${volts(window.min)}–${volts(window.max)} V`,
          note: `${volts(perCell.cutoffWindowV.min)}–${volts(perCell.cutoffWindowV.max)} V per cell`,
        },
      ];
      if (has(r, 'cutoffV')) {
        lines.push({ key: 'cutoffV', label: 'Your cutoff', value: `${volts(r.cutoffV)} V`, note: CHECK_LABELS[String(r.cutoffCheck)] });
      }
      return lines;
    }
    case 'throttle': {
      const lines: ResultLine[] = [];
      if (has(r, 'outputPctAt')) {
        lines.push({
          key: 'outputPctAt',
          label: `Output at ${num(Number(inputs.inputPct), 0)} % stick`,
          value: `${num(r.outputPctAt, 1)} %`,
          primary: true,
        });
      }
      lines.push({ key: 'rampTimeMs', label: 'Punch: 0 to full output', value: `${num(r.rampTimeMs, 0)} ms`, primary: true });
      if (has(r, 'rampTimeToOutputMs')) {
        lines.push({ key: 'rampTimeToOutputMs', label: 'Time to reach that output', value: `${num(r.rampTimeToOutputMs, 0)} ms` });
      }
      return lines;
    }
    case 'brake': {
      const lines: ResultLine[] = [
        { key: 'atNeutralPct', label: 'Brake at neutral (drag)', value: `${num(r.atNeutralPct, 0)} %`, primary: true },
        { key: 'justPastNeutralPct', label: 'Just past neutral', value: `${num(r.justPastNeutralPct, 0)} %` },
      ];
      if (has(r, 'brakeAtStickPct')) {
        lines.push({
          key: 'brakeAtStickPct',
          label: `At ${num(Number(inputs.brakeStickPct), 0)} % brake stick`,
          value: `${num(r.brakeAtStickPct, 1)} %`,
          primary: true,
        });
      }
      lines.push({ key: 'neutralFeel', label: 'Off-throttle feel', value: String(r.neutralFeel ?? '') });
      return lines;
    }
    case 'temperature': {
      const limits = r.bandLimitsC as { warmFromC: number; hotFromC: number; tooHotAboveC: number };
      // Both scales are the point of this calculator; the preferred one comes first.
      const c: ResultLine = { key: 'c', label: 'Celsius', value: `${num(r.c, 1)} °C`, primary: true };
      const f: ResultLine = { key: 'f', label: 'Fahrenheit', value: `${num(r.f, 1)} °F`, primary: true };
      return [
        ...(units === 'imperial' ? [f, c] : [c, f]),
        {
          key: 'band',
          label: `Band for a ${PART_LABELS[String(r.part)] ?? 'part'}`,
          value: BAND_LABELS[String(r.band)] ?? String(r.band),
          note: `warm from ${temp(limits.warmFromC, units, 0)}, hot from ${temp(limits.hotFromC, units, 0)}, too hot above ${temp(limits.tooHotAboveC, units, 0)}`,
        },
      ];
    }
    case 'run-time': {
      const lines: ResultLine[] = [
        { key: 'runTimeMin', label: 'Run time', value: `${num(r.runTimeMin, 1)} min`, note: `on ${num(r.usableMah, 0)} mAh of the capacity`, primary: true },
        { key: 'cRate', label: 'Average draw', value: `${num(r.cRate, 1)} C` },
        { key: 'runTimeToEmptyMin', label: 'To empty (never plan on this)', value: `${num(r.runTimeToEmptyMin, 1)} min` },
      ];
      if (has(r, 'maxAverageCurrentForRaceA')) {
        lines.push({
          key: 'maxAverageCurrentForRaceA',
          label: 'Most average current that lasts the race',
          value: `${num(r.maxAverageCurrentForRaceA, 1)} A`,
          note: r.lastsRace ? 'this pack lasts the race' : 'this pack runs short',
          primary: true,
        });
      }
      return lines;
    }
    case 'measured-kv':
      return [
        { key: 'measuredKv', label: 'Measured kV', value: `${num(r.measuredKv, 0)} rpm/V`, primary: true },
        { key: 'ktNmPerA', label: 'Torque constant', value: `${num(r.ktNmPerA, 6)} N·m/A` },
      ];
    case 'winding-resistance':
      return [
        { key: 'r20Ohm', label: 'At 20 °C', value: `${num(r.r20Ohm, 5)} Ω`, primary: true },
        { key: 'rAtTempOhm', label: `At ${num(Number(inputs.tempC), 1)} °C`, value: `${num(r.rAtTempOhm, 5)} Ω`, primary: true },
        { key: 'changePct', label: 'Change from 20 °C', value: `${num(r.changePct, 2)} %` },
      ];
    case 'electrical-degrees':
      return [
        { key: 'electricalDeg', label: 'Electrical', value: `${num(r.electricalDeg, 2)}°`, primary: true },
        { key: 'mechanicalDeg', label: 'Mechanical', value: `${num(r.mechanicalDeg, 2)}°`, primary: true },
        { key: 'polePairs', label: 'Pole pairs', value: num(r.polePairs, 0) },
      ];
    case 'bench-verdict':
      return [
        { key: 'verdict', label: 'Verdict', value: String(r.label ?? r.verdict), primary: true },
        { key: 'delta', label: 'Change', value: num(r.delta, 4), note: r.deltaPct === null ? undefined : `${num(r.deltaPct, 2)} % of the reference` },
      ];
  }
}

/** Unit text as a label shows it. */
export function unitLabel(unit: string): string {
  return unit === 'deg' ? '°' : unit;
}

/** Calculators whose results read better as a chart (kept here so checking costs no chart code). */
export function hasChart(name: string): boolean {
  return name === 'timing-curve' || name === 'throttle' || name === 'gearing';
}

import { gearingCalculator } from '../calc/gearing';
import { motorCalculator } from '../calc/motor';
import { packCalculator } from '../calc/pack';
import { HIGH_TIMING_DEG, timingCurveCalculator } from '../calc/timing-curve';
import { topSpeedCalculator } from '../calc/top-speed';
import type { CalcWarning, CalcWarningLevel } from '../calc/types';
import type { SetupRecord } from '../schemas/setup-record';

// Every number here comes from the calculators in ../calc; this file only decides which record
// fields feed which calculator and gathers their warnings. No formula is repeated here.

/** Motor speed at which total timing is read when nobody chooses one (a mid-straight speed for 2S classes). */
export const DEFAULT_TIMING_RPM = 20_000;
/** Share of no-load rpm reached on the track, for the estimated top speed (the top-speed calculator's own default). */
export const DEFAULT_LOAD_FACTOR = Number(topSpeedCalculator.defaults.loadFactor);

/** A caution on a setup, tagged with the part of the record it comes from. */
export type SetupCaution = CalcWarning & { source: 'gearing' | 'motor' | 'speed' | 'pack' | 'timing' | 'class' | 'compare' };

/** Values computed from one setup record. */
export type SetupComputed = {
  gearing: { finalDriveRatio: number; rolloutMm: number; rolloutIn: number; kmhPer1000Rpm: number } | null;
  pack: {
    chemistry: string;
    cells: number;
    fullV: number;
    nominalV: number;
    storageV: number | null;
    cutoffWindowV: { min: number; max: number };
    cutoffWindowPerCellV: { min: number; max: number };
    cutoffPerCellV: number | null;
    cutoffV: number | null;
    cutoffCheck: 'below-window' | 'in-window' | 'above-window' | null;
  } | null;
  /** No-load motor speed at the pack's nominal voltage; null without a kV. */
  motor: { volts: number; noLoadRpm: number } | null;
  /** Road speed at the pack's nominal voltage; null without a kV. */
  speed: { volts: number; loadFactor: number; noLoadKmh: number; loadedKmh: number; loadedMph: number } | null;
  /** Total timing (controller + endbell, electrical degrees) at `atRpm`; null when the ramp is incomplete. */
  timing: { atRpm: number; controllerDeg: number; endbellElectricalDeg: number; totalDeg: number; maxCombinedDeg: number; zeroTimingMode: boolean } | null;
  cautions: SetupCaution[];
};

export type ComputeOptions = { atRpm?: number; loadFactor?: number };

const LEVEL_ORDER: Record<CalcWarningLevel, number> = { danger: 0, caution: 1, info: 2 };

/** Sorts cautions most serious first and drops repeats of the same code. */
export function sortCautions<T extends CalcWarning>(cautions: T[]): T[] {
  const seen = new Set<string>();
  return cautions
    .filter((c) => {
      const key = `${c.code}|${(c as { side?: string }).side ?? ''}`;
      if (seen.has(key)) return false;
      seen.add(key);
      return true;
    })
    .sort((a, b) => LEVEL_ORDER[a.level] - LEVEL_ORDER[b.level]);
}

function run<T>(
  calc: { input: { safeParse(v: unknown): { success: boolean; data?: unknown } }; compute(i: never): { results: unknown; warnings: CalcWarning[] } },
  input: Record<string, unknown>,
) {
  const parsed = calc.input.safeParse(input);
  if (!parsed.success) return null;
  return calc.compute(parsed.data as never) as { results: T; warnings: CalcWarning[] };
}

function esc(record: SetupRecord, slug: string): number | undefined {
  return record.escSettings[slug]?.value;
}

/** Computes final drive ratio, rollout, pack voltages and cutoff check, no-load speed, estimated top speed and total timing for a record. */
export function computeSetup(record: SetupRecord, opts: ComputeOptions = {}): SetupComputed {
  const atRpm = opts.atRpm ?? DEFAULT_TIMING_RPM;
  const loadFactor = opts.loadFactor ?? DEFAULT_LOAD_FACTOR;
  const cautions: SetupCaution[] = [];
  const add = (source: SetupCaution['source'], warnings: CalcWarning[]) => cautions.push(...warnings.map((w) => ({ ...w, source })));
  const { gearing: g, battery, motor } = record;

  const gearingOut = run<{ finalDriveRatio: number; rolloutMm: number; rolloutIn: number; kmhPer1000Rpm: number }>(gearingCalculator, {
    spur: g.spurTeeth,
    pinion: g.pinionTeeth,
    internalRatio: g.internalRatio,
    tyreDiameterMm: g.tyreDiameterMm,
  });
  if (gearingOut) add('gearing', gearingOut.warnings);

  const cutoffPerCellV = esc(record, 'low-voltage-cutoff');
  type PackResults = {
    chemistry: string;
    cells: number;
    fullV: number;
    nominalV: number;
    storageV: number | null;
    cutoffWindowV: { min: number; max: number };
    cutoffV?: number;
    cutoffCheck?: 'below-window' | 'in-window' | 'above-window';
    perCell: { cutoffWindowV: { min: number; max: number } };
  };
  const packOut = run<PackResults>(packCalculator, {
    chemistry: battery.chemistry,
    cells: battery.cells,
    ...(cutoffPerCellV !== undefined ? { cutoffPerCellV } : {}),
  });
  if (packOut) add('pack', packOut.warnings);

  let motorResult: SetupComputed['motor'] = null;
  let speedResult: SetupComputed['speed'] = null;
  if (packOut && motor.kvRpmPerV !== undefined) {
    const volts = packOut.results.nominalV;
    const motorOut = run<{ noLoadRpm: number }>(motorCalculator, { kv: motor.kvRpmPerV, volts, poles: motor.poles });
    if (motorOut) {
      motorResult = { volts, noLoadRpm: motorOut.results.noLoadRpm };
      add('motor', motorOut.warnings);
    }
    const speedOut = run<{ noLoadKmh: number; loadedKmh: number; loadedMph: number }>(topSpeedCalculator, {
      kv: motor.kvRpmPerV,
      volts,
      spur: g.spurTeeth,
      pinion: g.pinionTeeth,
      internalRatio: g.internalRatio,
      tyreDiameterMm: g.tyreDiameterMm,
      loadFactor,
    });
    if (speedOut) {
      speedResult = { volts, loadFactor, noLoadKmh: speedOut.results.noLoadKmh, loadedKmh: speedOut.results.loadedKmh, loadedMph: speedOut.results.loadedMph };
      add('speed', speedOut.warnings);
    }
  } else if (motor.kvRpmPerV === undefined) {
    cautions.push({
      level: 'info',
      code: 'no-kv',
      source: 'motor',
      message: 'No motor kV in this record, so no-load speed and top speed are not computed (a wind alone does not fix the kV).',
    });
  }

  // Timing: in zero-timing mode the controller adds nothing, whatever its other timing values say.
  const zeroTimingMode = esc(record, 'zero-timing-mode') === 1;
  const baseDeg = zeroTimingMode ? 0 : (esc(record, 'static-timing') ?? 0);
  const rampDeg = zeroTimingMode ? 0 : (esc(record, 'ramped-advance') ?? 0);
  const stepDeg = zeroTimingMode ? 0 : esc(record, 'full-throttle-advance');
  let rampStartRpm = esc(record, 'ramp-start-rpm');
  let rampEndRpm = esc(record, 'ramp-end-rpm');
  let timingResult: SetupComputed['timing'] = null;
  if (rampDeg > 0 && (rampStartRpm === undefined || rampEndRpm === undefined)) {
    cautions.push({
      level: 'info',
      code: 'ramp-incomplete',
      source: 'timing',
      message: 'Ramped advance is set without both ramp start and ramp end speeds, so total timing is not computed.',
    });
  } else {
    if (rampDeg === 0 || rampStartRpm === undefined || rampEndRpm === undefined) {
      // With no ramp the speeds do not change the curve; any valid pair will do.
      rampStartRpm = 0;
      rampEndRpm = 1;
    }
    const timingOut = run<{ totalDegAt?: number; endbellElectricalDeg?: number; maxTotalDeg: number; maxCombinedDeg?: number }>(timingCurveCalculator, {
      baseDeg,
      rampDeg,
      rampStartRpm,
      rampEndRpm,
      atRpm,
      poles: motor.poles,
      ...(motor.endbellTimingDeg !== undefined ? { endbellDeg: motor.endbellTimingDeg } : {}),
      ...(stepDeg !== undefined && stepDeg > 0 ? { stepDeg } : {}),
      ...(stepDeg !== undefined && stepDeg > 0 && esc(record, 'full-throttle-delay') !== undefined ? { stepDelayS: esc(record, 'full-throttle-delay') } : {}),
    });
    if (timingOut) {
      const controllerDeg = timingOut.results.totalDegAt ?? 0;
      const endbellElectricalDeg = timingOut.results.endbellElectricalDeg ?? 0;
      timingResult = {
        atRpm,
        controllerDeg,
        endbellElectricalDeg,
        totalDeg: controllerDeg + endbellElectricalDeg,
        maxCombinedDeg: timingOut.results.maxCombinedDeg ?? timingOut.results.maxTotalDeg,
        zeroTimingMode,
      };
      add(
        'timing',
        timingOut.warnings.filter((w) => w.code !== 'poles-assumed'),
      );
    }
  }

  if (record.vehicle.class === 'touring-stock' && !zeroTimingMode) {
    cautions.push({
      level: 'caution',
      code: 'zero-timing-class',
      source: 'class',
      message:
        "Stock touring runs to the zero-timing rule: the controller must be in zero-timing mode and add no electronic advance. Set zero-timing mode to On and check your class and sanctioning body's rules.",
    });
  }

  return {
    gearing: gearingOut
      ? {
          finalDriveRatio: gearingOut.results.finalDriveRatio,
          rolloutMm: gearingOut.results.rolloutMm,
          rolloutIn: gearingOut.results.rolloutIn,
          kmhPer1000Rpm: gearingOut.results.kmhPer1000Rpm,
        }
      : null,
    pack: packOut
      ? {
          chemistry: packOut.results.chemistry,
          cells: packOut.results.cells,
          fullV: packOut.results.fullV,
          nominalV: packOut.results.nominalV,
          storageV: packOut.results.storageV,
          cutoffWindowV: packOut.results.cutoffWindowV,
          cutoffWindowPerCellV: packOut.results.perCell.cutoffWindowV,
          cutoffPerCellV: cutoffPerCellV ?? null,
          cutoffV: packOut.results.cutoffV ?? null,
          cutoffCheck: packOut.results.cutoffCheck ?? null,
        }
      : null,
    motor: motorResult,
    speed: speedResult,
    timing: timingResult,
    cautions: sortCautions(cautions),
  };
}

/** True when total timing at the chosen speed reaches the level where the timing calculator warns about heat. */
export function isHighTiming(timing: SetupComputed['timing']): boolean {
  return !!timing && timing.totalDeg >= HIGH_TIMING_DEG;
}

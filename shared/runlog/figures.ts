import { chemistryVoltages, type PackChemistry } from '../calc/chemistry';
import { roadSpeedKmh, finalDriveRatio } from '../calc/gearing';
import { temperatureBand, type TemperatureBand, type TemperaturePart } from '../calc/temperature';
import type { RunGap } from './parse';
import { FULL_THROTTLE_PCT, type ValueChannel } from './vocabulary';
import { typicalInterval } from './parse';

/** What a run is attached to, where the figures need it (pack for per-cell voltage, gearing for road speed). */
export type RunContext = {
  battery?: { chemistry: PackChemistry; cells: number } | null;
  gearing?: { spurTeeth: number; pinionTeeth: number; internalRatio: number; tyreDiameterMm: number } | null;
};

export type BandTimes = Record<TemperatureBand, number>;
export type RunCaution = { level: 'caution' | 'danger'; message: string };

/** The figures of a run, each from the raw samples; null where the run has no such channel. */
export type RunFigures = {
  durationS: number;
  sampleCount: number;
  sampleRateHz: number;
  gapCount: number;
  peakRpm: number | null;
  peakRpmAtS: number | null;
  topSpeedKmh: number | null;
  maxMotorTempC: number | null;
  maxEscTempC: number | null;
  motorBand: TemperatureBand | null;
  escBand: TemperatureBand | null;
  motorBandTimeS: BandTimes | null;
  escBandTimeS: BandTimes | null;
  peakCurrentA: number | null;
  meanCurrentA: number | null;
  minPackV: number | null;
  restPackV: number | null;
  minCellV: number | null;
  cutoffWindowV: { min: number; max: number } | null;
  energyMah: number | null;
  energyWh: number | null;
  energyIsEstimate: true;
  fullThrottleShare: number | null;
  cautions: RunCaution[];
};

type Channels = Partial<Record<ValueChannel, ArrayLike<number>>>;

/** Marks the intervals that may be integrated: both ends present and no gap between them. */
function usableIntervals(time: ArrayLike<number>, gaps: RunGap[]): Uint8Array {
  const ok = new Uint8Array(Math.max(0, time.length - 1)).fill(1);
  let g = 0;
  for (let i = 0; i < ok.length; i++) {
    while (g < gaps.length && gaps[g].toS < time[i + 1]) g++;
    if (g < gaps.length && gaps[g].fromS === time[i] && gaps[g].toS === time[i + 1]) ok[i] = 0;
  }
  return ok;
}

/**
 * Charge and energy by the composite trapezoidal rule over the real timestamps, skipping gaps and intervals
 * with a missing end: mAh = Σ ½(Iₖ + Iₖ₊₁)Δt / 3.6, Wh = Σ ½(VₖIₖ + Vₖ₊₁Iₖ₊₁)Δt / 3600 (I in A, V in V, t in s).
 * Sampled charge counting misses what happens between samples: an estimate.
 */
export function integrateEnergy(time: ArrayLike<number>, current: ArrayLike<number>, voltage: ArrayLike<number> | null, gaps: RunGap[] = []) {
  const ok = usableIntervals(time, gaps);
  let coulombs = 0;
  let joules = 0;
  let seconds = 0;
  for (let i = 0; i < ok.length; i++) {
    if (!ok[i]) continue;
    const dt = time[i + 1] - time[i];
    const a = current[i];
    const b = current[i + 1];
    if (Number.isNaN(a) || Number.isNaN(b)) continue;
    coulombs += 0.5 * (a + b) * dt;
    seconds += dt;
    if (voltage && !Number.isNaN(voltage[i]) && !Number.isNaN(voltage[i + 1])) joules += 0.5 * (voltage[i] * a + voltage[i + 1] * b) * dt;
  }
  return { mah: coulombs / 3.6, wh: voltage ? joules / 3600 : null, seconds };
}

function peak(values: ArrayLike<number>, pick: (a: number, b: number) => boolean): { value: number; index: number } | null {
  let best: { value: number; index: number } | null = null;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isNaN(v)) continue;
    if (!best || pick(v, best.value)) best = { value: v, index: i };
  }
  return best;
}

/** Seconds spent in each temperature band (each interval counted in the band of its first sample). */
function bandTimes(time: ArrayLike<number>, temps: ArrayLike<number>, part: TemperaturePart, ok: Uint8Array): BandTimes {
  const out: BandTimes = { cool: 0, warm: 0, hot: 0, 'too-hot': 0 };
  for (let i = 0; i < ok.length; i++) if (ok[i] && !Number.isNaN(temps[i])) out[temperatureBand(temps[i], part)] += time[i + 1] - time[i];
  return out;
}

/** Share of the usable time with throttle at or above {@link FULL_THROTTLE_PCT}. */
function fullThrottle(time: ArrayLike<number>, throttle: ArrayLike<number>, ok: Uint8Array): number | null {
  let full = 0;
  let total = 0;
  for (let i = 0; i < ok.length; i++) {
    if (!ok[i] || Number.isNaN(throttle[i])) continue;
    const dt = time[i + 1] - time[i];
    total += dt;
    if (throttle[i] >= FULL_THROTTLE_PCT) full += dt;
  }
  return total > 0 ? full / total : null;
}

/** Pack voltage at rest: the mean before the car first moves (throttle over 5 % or current over 2 A), else the first reading. */
function restVoltage(v: ArrayLike<number>, throttle?: ArrayLike<number>, current?: ArrayLike<number>): number | null {
  let sum = 0;
  let count = 0;
  for (let i = 0; i < v.length; i++) {
    if ((throttle && throttle[i] > 5) || (current && current[i] > 2)) break;
    if (!Number.isNaN(v[i])) {
      sum += v[i];
      count++;
    }
  }
  if (count) return sum / count;
  const first = peak(v, () => false);
  return first ? first.value : null;
}

/** Computes every figure of a run from its samples, with the usual cautions where heat or a cell went past the window. */
export function computeRunFigures(time: ArrayLike<number>, channels: Channels, gaps: RunGap[], context: RunContext = {}): RunFigures {
  const n = time.length;
  const durationS = n > 1 ? time[n - 1] - time[0] : 0;
  const dt = typicalInterval(time);
  const ok = usableIntervals(time, gaps);
  const { motor_rpm: rpm, motor_temp_c: motorT, esc_temp_c: escT, current_a: current, pack_v: pack, throttle_pct: throttle } = channels;

  const rpmPeak = rpm ? peak(rpm, (a, b) => a > b) : null;

  const motorMax = motorT ? peak(motorT, (a, b) => a > b) : null;
  const escMax = escT ? peak(escT, (a, b) => a > b) : null;
  const motorBand = motorMax ? temperatureBand(motorMax.value, 'motor') : null;
  const escBand = escMax ? temperatureBand(escMax.value, 'esc') : null;

  const energy = current ? integrateEnergy(time, current, pack ?? null, gaps) : null;
  const currentPeak = current ? peak(current, (a, b) => a > b) : null;
  const minPack = pack ? peak(pack, (a, b) => a < b) : null;

  const base: RunFigures = {
    durationS,
    sampleCount: n,
    sampleRateHz: dt > 0 ? 1 / dt : 0,
    gapCount: gaps.length,
    peakRpm: rpmPeak?.value ?? null,
    peakRpmAtS: rpmPeak ? time[rpmPeak.index] - time[0] : null,
    topSpeedKmh: null,
    maxMotorTempC: motorMax?.value ?? null,
    maxEscTempC: escMax?.value ?? null,
    motorBand,
    escBand,
    motorBandTimeS: motorT ? bandTimes(time, motorT, 'motor', ok) : null,
    escBandTimeS: escT ? bandTimes(time, escT, 'esc', ok) : null,
    peakCurrentA: currentPeak?.value ?? null,
    meanCurrentA: energy && energy.seconds > 0 ? (energy.mah * 3.6) / energy.seconds : null,
    minPackV: minPack?.value ?? null,
    restPackV: pack ? restVoltage(pack, throttle, current) : null,
    minCellV: null,
    cutoffWindowV: null,
    energyMah: energy ? energy.mah : null,
    energyWh: energy ? energy.wh : null,
    energyIsEstimate: true,
    fullThrottleShare: throttle ? fullThrottle(time, throttle, ok) : null,
    cautions: [],
  };
  return withRunContext(base, context);
}

/**
 * The figures that depend on what the run is attached to (road speed from the setup's gearing, per-cell voltage
 * against the chemistry's window) and the cautions, worked out again from the sample figures: attaching a run to
 * another setup, or detaching it, changes these and nothing else, so the stored samples are never read again.
 */
export function withRunContext(figures: RunFigures, context: RunContext = {}): RunFigures {
  const cautions: RunCaution[] = [];
  for (const [band, what] of [
    [figures.motorBand, 'motor'],
    [figures.escBand, 'speed controller'],
  ] as const) {
    if (band === 'too-hot')
      cautions.push({
        level: 'danger',
        message: `The ${what} went past the hot band: stop, let it cool, and gear down or reduce timing before the next run. Follow the maker's limits.`,
      });
    else if (band === 'hot')
      cautions.push({ level: 'caution', message: `The ${what} reached the hot band: check it after the next run and stay within the maker's limits.` });
  }
  const g = context.gearing;
  const topSpeedKmh =
    figures.peakRpm !== null && g ? roadSpeedKmh(figures.peakRpm, g.tyreDiameterMm, finalDriveRatio(g.spurTeeth, g.pinionTeeth, g.internalRatio)) : null;
  const battery = context.battery;
  const window = battery ? chemistryVoltages[battery.chemistry].cutoffWindowV : null;
  const minCellV = figures.minPackV !== null && battery ? figures.minPackV / battery.cells : null;
  if (minCellV !== null && window && minCellV < window.min) {
    cautions.push({
      level: 'danger',
      message: `A cell went to about ${minCellV.toFixed(2)} V under load, below the usual cutoff window (${window.min}–${window.max} V per cell): over-discharge damages ${battery!.chemistry === 'nimh' ? 'the pack' : 'lithium cells and can make them swell or catch fire'}. Check the low-voltage cutoff and follow the pack maker's instructions.`,
    });
  }
  return { ...figures, topSpeedKmh, minCellV, cutoffWindowV: window, cautions };
}

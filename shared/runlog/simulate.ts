/**
 * A small run simulator for invented demo runs (never real data): a lap's throttle trace on the demo
 * track, motor speed from kV and a sagging pack voltage, current from the throttle and the speed still to
 * gain, and first-order motor and controller temperatures. Deterministic for a seed.
 */
export type SimulationOptions = {
  seed: number;
  durationS: number;
  rateHz: number;
  kvRpmPerV: number;
  cells: number;
  capacityMah: number;
  ambientC: number;
  /** Multiplies the current drawn (taller gearing or more timing draws more). */
  loadScale?: number;
  /** Seconds of the car sitting at neutral before the first lap (pack at rest). */
  idleS?: number;
};

// One lap of the invented Harbour Flats Indoor layout: [seconds, throttle %] per section.
const LAP: Array<[number, number]> = [
  [2.4, 100], // main straight
  [0.5, 0], // braking into the hairpin
  [1.1, 35], // hairpin
  [1.3, 100], // back straight
  [0.4, 10], // lift into the sweeper
  [1.6, 60], // sweeper
  [0.9, 85], // rhythm section
  [0.6, 20], // double
  [1.2, 70], // kink onto the main straight
];

/** Mulberry32: a tiny seeded generator, so demo runs are the same on every seed. */
function random(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Throttle (%) at a time into the run, with the lap repeating after the idle start. */
function throttleAt(t: number, idleS: number): number {
  if (t < idleS) return 0;
  const lapS = LAP.reduce((s, [d]) => s + d, 0);
  let x = (t - idleS) % lapS;
  for (const [d, thr] of LAP) {
    if (x < d) return thr;
    x -= d;
  }
  return 0;
}

/** Simulates a run and writes it in our `tunewright.runlog` CSV vocabulary. */
export function simulateRunCsv(opts: SimulationOptions): string {
  const rnd = random(opts.seed);
  const dt = 1 / opts.rateHz;
  const n = Math.floor(opts.durationS * opts.rateHz) + 1;
  const idleS = opts.idleS ?? 2;
  const load = opts.loadScale ?? 1;
  const rInternal = 0.006 * opts.cells;
  let rpm = 0;
  let usedAs = 0;
  let motorT = opts.ambientC;
  let escT = opts.ambientC;
  let thrSmooth = 0;
  const lines = ['time_s,throttle_pct,motor_rpm,motor_temp_c,esc_temp_c,current_a,pack_v'];
  for (let i = 0; i < n; i++) {
    const t = i * dt;
    const target = throttleAt(t, idleS);
    thrSmooth += (target - thrSmooth) * Math.min(1, dt / 0.08);
    const thr = Math.max(0, Math.min(100, thrSmooth + (target > 0 ? (rnd() - 0.5) * 4 : 0)));
    const openV = opts.cells * (4.2 - 0.5 * Math.min(1, usedAs / 3.6 / opts.capacityMah));
    const wanted = opts.kvRpmPerV * openV * 0.9 * (thr / 100);
    const current = load * (0.4 + 38 * Math.pow(thr / 100, 1.6) + Math.max(0, wanted - rpm) * 0.0025) + (rnd() - 0.5) * 0.6;
    const packV = openV - current * rInternal;
    rpm += (opts.kvRpmPerV * packV * 0.9 * (thr / 100) - rpm) * Math.min(1, dt / 0.35);
    usedAs += Math.max(0, current) * dt;
    motorT += (opts.ambientC + 1.55 * current - motorT) * (dt / 140);
    escT += (opts.ambientC + 0.95 * current - escT) * (dt / 70);
    lines.push(
      [t.toFixed(3), thr.toFixed(1), Math.max(0, rpm).toFixed(0), motorT.toFixed(2), escT.toFixed(2), Math.max(0, current).toFixed(2), packV.toFixed(3)].join(
        ',',
      ),
    );
  }
  return lines.join('\n') + '\n';
}

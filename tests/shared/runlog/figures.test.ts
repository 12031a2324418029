import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeRunFigures, integrateEnergy, withRunContext } from '../../../shared/runlog/figures';
import { parseRunlog } from '../../../shared/runlog/parse';

const range = (n: number, f: (i: number) => number) => Float64Array.from({ length: n }, (_v, i) => f(i));

describe('integrateEnergy (trapezoidal rule over real timestamps)', () => {
  it('a constant 10 A for 360 s is exactly 1,000 mAh', () => {
    const t = range(361, (i) => i);
    const i = range(361, () => 10);
    // 10 A × 0.1 h = 1 Ah = 1000 mAh (definition of the ampere-hour); mathjs agrees: 10 A * 360 s to mA hour.
    expect(integrateEnergy(t, i, null).mah).toBeCloseTo(1000, 9);
    expect(evaluate('10 A * 360 s').toNumber('mA hour')).toBeCloseTo(1000, 9); // mathjs units oracle
  });

  it('integrates piecewise-linear current exactly, even on uneven timestamps', () => {
    // Breakpoints (s, A): 0→0, 2→20, 5→20, 6→0, 10→40. Exact area by triangles and trapezoids (closed form):
    // 20 + 60 + 10 + 80 = 170 A·s → 170 / 3.6 = 47.222… mAh.
    const t = Float64Array.from([0, 0.5, 2, 3.7, 5, 6, 7.25, 10]);
    const pw = (x: number) => (x <= 2 ? 10 * x : x <= 5 ? 20 : x <= 6 ? 20 - 20 * (x - 5) : 10 * (x - 6));
    const i = Float64Array.from(t, pw);
    expect(integrateEnergy(t, i, null).mah).toBeCloseTo(170 / 3.6, 10); // closed form above
  });

  it('agrees with the closed-form integral of a smooth current (mathjs for the units)', () => {
    // I(t) = 20 + 10 sin(t) A over 0–60 s; ∫ = 20·60 + 10(1 − cos 60) A·s (calculus: antiderivative of sin is −cos).
    const t = range(6001, (k) => k * 0.01);
    const i = Float64Array.from(t, (x) => 20 + 10 * Math.sin(x));
    const exactAs = 20 * 60 + 10 * (1 - Math.cos(60));
    const expected = evaluate(`${exactAs} A s`).toNumber('mA hour'); // mathjs units oracle for A·s → mAh
    // The composite trapezoid's error is −(b−a)h²f''/12 at most (numerical-analysis texts): here under 1e-4 A·s.
    expect(Math.abs(integrateEnergy(t, i, null).mah - expected)).toBeLessThan(1e-4);
  });

  it('Wh from voltage × current, checked with mathjs', () => {
    const t = range(361, (k) => k);
    const res = integrateEnergy(
      t,
      range(361, () => 10),
      range(361, () => 7.4),
    );
    expect(res.wh).toBeCloseTo(evaluate('7.4 V * 10 A * 360 s').toNumber('W hour'), 9); // mathjs oracle: 7.4 Wh
  });

  it('never integrates across a gap', () => {
    const run = parseRunlog('time_s,current_a\n0,10\n1,10\n2,10\n3,10\n100,10\n101,10\n');
    if (!run.ok) throw new Error('parse');
    const figures = computeRunFigures(run.run.time, run.run.channels, run.run.gaps);
    // 4 s of 10 A = 40 A·s → 11.11 mAh (the 97 s gap is left out).
    expect(figures.energyMah).toBeCloseTo(40 / 3.6, 9); // 1 mAh = 3.6 A·s (definition)
    expect(figures.gapCount).toBe(1);
  });
});

describe('computeRunFigures', () => {
  const t = range(101, (k) => k * 0.1); // 10 s at 10 Hz
  const throttle = Float64Array.from(t, (x) => (x >= 2 && x < 7 ? 100 : 10));
  const rpm = Float64Array.from(t, (x) => (Math.abs(x - 6) < 1e-9 ? 33600 : 20000));
  const motor = Float64Array.from(t, (x) => 40 + 4 * x); // 40 → 80 °C
  const pack = Float64Array.from(t, (x) => (x < 1 ? 8.4 : 8.4 - 0.2 * x)); // 8.4 → 6.4 V
  const current = Float64Array.from(t, () => 0);

  const figures = computeRunFigures(t, { throttle_pct: throttle, motor_rpm: rpm, motor_temp_c: motor, pack_v: pack, current_a: current }, [], {
    battery: { chemistry: 'lipo', cells: 2 },
    gearing: { spurTeeth: 84, pinionTeeth: 40, internalRatio: 1.9, tyreDiameterMm: 64 },
  });

  it('duration, sample count and rate', () => {
    expect(figures.durationS).toBeCloseTo(10, 9);
    expect(figures.sampleCount).toBe(101);
    expect(figures.sampleRateHz).toBeCloseTo(10, 6);
  });

  it('peak motor speed, when, and top speed through the shared gearing calculator', () => {
    expect(figures.peakRpm).toBe(33600);
    expect(figures.peakRpmAtS).toBeCloseTo(6, 9);
    // Spur 84, pinion 40, internal 1.9 → FDR 3.99; 64 mm tyre at 33,600 rpm → 101.59 km/h
    // (speed = rpm × π × tyre diameter / final drive ratio; common practice, from the gear-train relation, Wikipedia "Gear train").
    expect(figures.topSpeedKmh).toBeCloseTo(101.59, 2);
  });

  it('share of time at full throttle', () => {
    expect(figures.fullThrottleShare).toBeCloseTo(0.5, 6); // 5 s of 10 s by construction
  });

  it('hottest reading, its band and time per band (motors kept under about 71–82 °C: common practice)', () => {
    expect(figures.maxMotorTempC).toBeCloseTo(80, 9);
    expect(figures.motorBand).toBe('hot');
    const bands = figures.motorBandTimeS!;
    expect(bands.cool + bands.warm + bands.hot + bands['too-hot']).toBeCloseTo(10, 6);
    expect(figures.cautions.some((c) => /motor reached the hot band/.test(c.message))).toBe(true);
  });

  it('pack at rest and lowest, per cell against the LiPo cutoff window (3.0–3.4 V per cell: common practice)', () => {
    expect(figures.restPackV).toBeCloseTo(8.4, 9);
    expect(figures.minPackV).toBeCloseTo(6.4, 6);
    expect(figures.minCellV).toBeCloseTo(3.2, 6); // 6.4 V / 2 cells, inside the window: no caution
    expect(figures.cautions.some((c) => /cutoff window/.test(c.message))).toBe(false);
    const low = computeRunFigures(t, { pack_v: Float64Array.from(t, () => 5.6) }, [], { battery: { chemistry: 'lipo', cells: 2 } });
    expect(low.minCellV).toBeCloseTo(2.8, 9); // 5.6 V / 2 cells, under 3.0 V
    expect(low.cautions.find((c) => /cutoff window/.test(c.message))?.level).toBe('danger');
  });

  it('attaching and detaching a setup afterwards (withRunContext) gives what computing with it from the start gives', () => {
    const bare = computeRunFigures(t, { throttle_pct: throttle, motor_rpm: rpm, motor_temp_c: motor, pack_v: pack, current_a: current }, []);
    expect([bare.topSpeedKmh, bare.minCellV, bare.cutoffWindowV]).toEqual([null, null, null]);
    const gearing = { spurTeeth: 84, pinionTeeth: 40, internalRatio: 1.9, tyreDiameterMm: 64 };
    const attached = withRunContext(bare, { battery: { chemistry: 'lipo', cells: 2 }, gearing });
    expect(attached).toEqual(figures);
    // mathjs evaluating the gear-train relation with its own units (Wikipedia "Gear train": stage ratios multiply; road speed = wheel rpm × π d)
    expect(attached.topSpeedKmh!).toBeCloseTo(evaluate('33600 / (84 / 40 * 1.9) * pi * 64 mm / minute').toNumber('km/h'), 9);
    // Detaching drops the setup's figures but keeps the temperature caution, which needs no setup.
    const detached = withRunContext(attached, {});
    expect([detached.topSpeedKmh, detached.minCellV]).toEqual([null, null]);
    expect(detached.cautions.map((c) => c.level)).toEqual(['caution']);
    const lowPack = withRunContext({ ...bare, minPackV: 5.6 }, { battery: { chemistry: 'lipo', cells: 2 } });
    expect(lowPack.cautions.find((c) => /cutoff window/.test(c.message))?.level).toBe('danger'); // 2.8 V per cell, under LiPo's 3.0 V (common practice)
  });

  it('null for channels the run does not have', () => {
    const bare = computeRunFigures(t, {}, []);
    expect([bare.peakRpm, bare.energyMah, bare.maxEscTempC, bare.fullThrottleShare, bare.topSpeedKmh]).toEqual([null, null, null, null, null]);
    expect(bare.energyIsEstimate).toBe(true);
  });
});

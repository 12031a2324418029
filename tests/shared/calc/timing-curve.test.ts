import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeTimingCurve, timingAt, type TimingCurveInput, type TimingCurveResults } from '../../../shared/calc/timing-curve';
import { issueAt, rejected, run } from './helpers';

const ramp30 = { baseDeg: 0, rampDeg: 30, rampStartRpm: 10_000, rampEndRpm: 30_000 };

describe('timing-curve calculator', () => {
  it('ramps 30° over 10,000–30,000 rpm: 0° at 10k, 15° at 20k, 30° at 30k and above', () => {
    // a speed-dependent lead rising linearly from the start to the end speed (from memory; general industrial servo-drive practice): 30° over 10k–30k rpm
    expect(run<TimingCurveResults>('timing-curve', { ...ramp30, atRpm: 10_000 }).results.totalDegAt).toBe(0); // at the start speed: no lead yet (same source)
    expect(run<TimingCurveResults>('timing-curve', { ...ramp30, atRpm: 20_000 }).results.totalDegAt).toBe(15); // half-way: half the lead (same source)
    expect(run<TimingCurveResults>('timing-curve', { ...ramp30, atRpm: 30_000 }).results.totalDegAt).toBe(30); // at the end speed: the full lead (same source)
    expect(run<TimingCurveResults>('timing-curve', { ...ramp30, atRpm: 45_000 }).results.totalDegAt).toBe(30); // above the end speed it stays at the full lead (same source)
    expect(run<TimingCurveResults>('timing-curve', { ...ramp30, atRpm: 5_000 }).results.totalDegAt).toBe(0); // clamp below the start
  });

  it('puts the ramp corners on the chart exactly and ends it 25 % past the ramp end by default', () => {
    const { points } = computeTimingCurve(ramp30).results;
    expect(points.find((p) => p.rpm === 10_000)?.deg).toBe(0); // no lead at the start speed (from memory; general industrial servo-drive practice)
    expect(points.find((p) => p.rpm === 30_000)?.deg).toBe(30); // the full lead at the end speed (same source)
    expect(points[0]).toEqual({ rpm: 0, deg: 0 });
    expect(points.at(-1)!.rpm).toBe(38_000); // 30,000 × 1.25 = 37,500, rounded up to a whole 1,000
    expect(points.every((p) => p.fullThrottleDeg === undefined)).toBe(true);
  });

  it('adds the base timing everywhere and the full-throttle step as a second curve', () => {
    const { results } = computeTimingCurve({
      ...ramp30,
      baseDeg: 10,
      stepDeg: 15,
      stepDelayS: 0.3,
      atRpm: 20_000,
      maxRpm: 40_000,
    });
    expect(results.totalDegAt).toBe(25); // 10° base + 15°: half of a 30° linear lead at the midpoint (from memory; general industrial servo-drive practice)
    expect(results.totalDegAtFullThrottle).toBe(40); // 25° + the 15° full-throttle step on top (common practice: the step adds to the ramp)
    expect(results.maxTotalDeg).toBe(55); // 10° base + 30° full ramp + 15° step (common practice: the parts add)
    expect(results.stepDelayS).toBe(0.3); // passed through as entered
    for (const p of results.points) expect(p.fullThrottleDeg).toBeCloseTo(p.deg + 15, 9);
    expect(results.points.at(-1)!.rpm).toBe(40_000); // the chart ends at the maxRpm asked for
  });

  it('turns mechanical endbell degrees into electrical degrees by pole pairs', () => {
    // mechanical degrees × pole pairs = electrical degrees (Ohio University EE notes, ch. 14, §14.3: n = 120 f / P)
    expect(computeTimingCurve({ ...ramp30, endbellDeg: 10, poles: 4 }).results.endbellElectricalDeg).toBe(20); // 10° × 2 pole pairs
    expect(computeTimingCurve({ ...ramp30, endbellDeg: 10, poles: 2 }).results.endbellElectricalDeg).toBe(10); // 10° × 1 pole pair
    const assumed = computeTimingCurve({ ...ramp30, endbellDeg: 10 });
    expect(assumed.results.endbellElectricalDeg).toBe(10); // 2 poles assumed, as most spec-class motors have (common practice)
    expect(assumed.warnings.map((w) => w.code)).toContain('poles-assumed');
    expect(computeTimingCurve({ ...ramp30, endbellDeg: 10, poles: 4 }).results.maxCombinedDeg).toBe(50); // 30° full lead + 20° electrical endbell (common practice: controller and endbell timing add)
  });

  it('cautions about heat at high total timing, deferring to the makers', () => {
    const hot = computeTimingCurve({ ...ramp30, baseDeg: 10, stepDeg: 15, endbellDeg: 20 });
    const caution = hot.warnings.find((w) => w.code === 'high-timing');
    expect(caution?.level).toBe('caution');
    expect(caution?.message).toMatch(/makers' limits/);
    expect(computeTimingCurve({ ...ramp30, rampDeg: 20 }).warnings.map((w) => w.code)).not.toContain('high-timing');
  });

  it('notes that zero-timing spec classes forbid electronic advance', () => {
    // zero-timing spec classes: the controller adds no electronic advance of any kind (published club and national rulebooks for spec classes; common practice)
    const blinky = computeTimingCurve({ ...ramp30, rampDeg: 0 });
    expect(blinky.warnings.map((w) => w.code)).toContain('zero-timing');
    expect(blinky.results.points.every((p) => p.deg === 0)).toBe(true);
    const boosted = computeTimingCurve(ramp30);
    expect(boosted.warnings.find((w) => w.code === 'spec-class-rules')?.message).toMatch(/forbid/);
  });

  it('says when a delay is given without a step', () => {
    const { warnings } = computeTimingCurve({ ...ramp30, stepDelayS: 0.5 });
    expect(warnings.find((w) => w.code === 'delay-without-step')?.field).toBe('stepDelayS');
  });

  it('never decreases with rpm and stays within base..base+ramp(+step) (property)', () => {
    const curve = fc
      .record({
        baseDeg: fc.integer({ min: 0, max: 60 }),
        rampDeg: fc.integer({ min: 0, max: 80 }),
        rampStartRpm: fc.integer({ min: 0, max: 90_000 }),
        span: fc.integer({ min: 1, max: 10_000 }),
        stepDeg: fc.integer({ min: 0, max: 40 }),
      })
      .map(({ span, ...rest }): TimingCurveInput => ({ ...rest, rampEndRpm: rest.rampStartRpm + span }));
    fc.assert(
      fc.property(curve, (input) => {
        const { points } = computeTimingCurve(input).results;
        const top = input.baseDeg + input.rampDeg;
        for (let i = 0; i < points.length; i++) {
          expect(points[i].deg).toBeGreaterThanOrEqual(input.baseDeg);
          expect(points[i].deg).toBeLessThanOrEqual(top);
          if (input.stepDeg! > 0) expect(points[i].fullThrottleDeg).toBeLessThanOrEqual(top + input.stepDeg!);
          if (i > 0) {
            expect(points[i].rpm).toBeGreaterThan(points[i - 1].rpm);
            expect(points[i].deg).toBeGreaterThanOrEqual(points[i - 1].deg);
          }
        }
      }),
    );
    fc.assert(
      fc.property(curve, fc.integer({ min: 0, max: 150_000 }), fc.integer({ min: 0, max: 150_000 }), (input, a, b) => {
        const [low, high] = a <= b ? [a, b] : [b, a];
        expect(timingAt(high, input)).toBeGreaterThanOrEqual(timingAt(low, input));
      }),
    );
  });

  it('rejects a ramp end at or below the start on the rampEndRpm field', () => {
    const issue = issueAt(rejected('timing-curve', { ...ramp30, rampEndRpm: 10_000 }), 'rampEndRpm');
    expect(issue.message).toBe('Ramp end must be above the ramp start (10000 rpm)');
    expect(issueAt(rejected('timing-curve', { ...ramp30, rampEndRpm: 5_000 }), 'rampEndRpm').message).toMatch(/above the ramp start/);
  });

  it('rejects out-of-range, odd-pole and unknown fields, naming each', () => {
    const issues = rejected('timing-curve', { ...ramp30, baseDeg: 70, poles: 5, boostDeg: 10 });
    expect(issueAt(issues, 'baseDeg').message).toBe('Base timing must be at most 60°');
    expect(issueAt(issues, 'poles').message).toMatch(/even/);
    expect(issueAt(issues, 'boostDeg').message).toMatch(/Unknown field "boostDeg"/);
    expect(issueAt(rejected('timing-curve', { ...ramp30, atRpm: 'fast' }), 'atRpm').message).toBe('Read at must be a number (got "fast")');
  });
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  computeTimingCurve,
  timingAt,
  type TimingCurveInput,
  type TimingCurveResults,
} from '../../../shared/calc/timing-curve';
import { issueAt, rejected, run } from './helpers';

const ramp30 = { baseDeg: 0, rampDeg: 30, rampStartRpm: 10_000, rampEndRpm: 30_000 };

describe('timing-curve calculator', () => {
  it('ramps 30° over 10,000–30,000 rpm: 0° at 10k, 15° at 20k, 30° at 30k and above', () => {
    // REFERENCES.md "Timing advance": linear speed-dependent lead (from memory; servo-drive practice)
    expect(run<TimingCurveResults>('timing-curve', { ...ramp30, atRpm: 10_000 }).results.totalDegAt).toBe(0); // REFERENCES.md
    expect(run<TimingCurveResults>('timing-curve', { ...ramp30, atRpm: 20_000 }).results.totalDegAt).toBe(15); // REFERENCES.md
    expect(run<TimingCurveResults>('timing-curve', { ...ramp30, atRpm: 30_000 }).results.totalDegAt).toBe(30); // REFERENCES.md
    expect(run<TimingCurveResults>('timing-curve', { ...ramp30, atRpm: 45_000 }).results.totalDegAt).toBe(30); // REFERENCES.md "and above"
    expect(run<TimingCurveResults>('timing-curve', { ...ramp30, atRpm: 5_000 }).results.totalDegAt).toBe(0); // clamp below the start
  });

  it('puts the ramp corners on the chart exactly and ends it 25 % past the ramp end by default', () => {
    const { points } = computeTimingCurve(ramp30).results;
    expect(points.find((p) => p.rpm === 10_000)?.deg).toBe(0);
    expect(points.find((p) => p.rpm === 30_000)?.deg).toBe(30);
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
    expect(results.totalDegAt).toBe(25); // 10 + 15: the ramp model in REFERENCES.md plus base
    expect(results.totalDegAtFullThrottle).toBe(40);
    expect(results.maxTotalDeg).toBe(55);
    expect(results.stepDelayS).toBe(0.3);
    for (const p of results.points) expect(p.fullThrottleDeg).toBeCloseTo(p.deg + 15, 9);
    expect(results.points.at(-1)!.rpm).toBe(40_000);
  });

  it('turns mechanical endbell degrees into electrical degrees by pole pairs', () => {
    // REFERENCES.md "Timing advance": mechanical degrees × pole pairs = electrical degrees
    expect(computeTimingCurve({ ...ramp30, endbellDeg: 10, poles: 4 }).results.endbellElectricalDeg).toBe(20);
    expect(computeTimingCurve({ ...ramp30, endbellDeg: 10, poles: 2 }).results.endbellElectricalDeg).toBe(10);
    const assumed = computeTimingCurve({ ...ramp30, endbellDeg: 10 });
    expect(assumed.results.endbellElectricalDeg).toBe(10);
    expect(assumed.warnings.map((w) => w.code)).toContain('poles-assumed');
    expect(computeTimingCurve({ ...ramp30, endbellDeg: 10, poles: 4 }).results.maxCombinedDeg).toBe(50);
  });

  it('cautions about heat at high total timing, deferring to the makers', () => {
    const hot = computeTimingCurve({ ...ramp30, baseDeg: 10, stepDeg: 15, endbellDeg: 20 });
    const caution = hot.warnings.find((w) => w.code === 'high-timing');
    expect(caution?.level).toBe('caution');
    expect(caution?.message).toMatch(/makers' limits/);
    expect(computeTimingCurve({ ...ramp30, rampDeg: 20 }).warnings.map((w) => w.code)).not.toContain('high-timing');
  });

  it('notes that zero-timing spec classes forbid electronic advance', () => {
    // REFERENCES.md "Zero-timing spec classes": the controller adds no electronic advance of any kind
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
    expect(issueAt(rejected('timing-curve', { ...ramp30, rampEndRpm: 5_000 }), 'rampEndRpm').message).toMatch(
      /above the ramp start/,
    );
  });

  it('rejects out-of-range, odd-pole and unknown fields, naming each', () => {
    const issues = rejected('timing-curve', { ...ramp30, baseDeg: 70, poles: 5, boostDeg: 10 });
    expect(issueAt(issues, 'baseDeg').message).toBe('Base timing must be at most 60°');
    expect(issueAt(issues, 'poles').message).toMatch(/even/);
    expect(issueAt(issues, 'boostDeg').message).toMatch(/Unknown field "boostDeg"/);
    expect(issueAt(rejected('timing-curve', { ...ramp30, atRpm: 'fast' }), 'atRpm').message).toBe(
      'Read at must be a number (got "fast")',
    );
  });
});

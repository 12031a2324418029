import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { brakeAtStick, computeBrake, type BrakeResults } from '../../../shared/calc/brake';
import { issueAt, rejected, run } from './helpers';

describe('brake calculator', () => {
  it('applies the drag brake at neutral, the initial brake just past it and the strength at full stick', () => {
    const { results } = run<BrakeResults>('brake', {
      dragBrakePct: 10,
      initialBrakePct: 15,
      brakeStrengthPct: 80,
      brakeStickPct: 50,
    });
    expect(results.atNeutralPct).toBe(10); // REFERENCES.md (common practice): drag brake is the brake at neutral
    expect(results.justPastNeutralPct).toBeCloseTo(15, 9); // REFERENCES.md: initial brake is the minimum just past neutral
    expect(results.points.at(-1)).toEqual({ stickPct: 100, brakePct: 80 }); // REFERENCES.md: brake strength at full brake stick
    expect(results.brakeAtStickPct).toBeCloseTo(47.5, 9); // linear between 15 and 80 at half stick (model in brake.ts)
    expect(results.points[0]).toEqual({ stickPct: 0, brakePct: 10 });
  });

  it('describes the off-throttle feel by drag brake', () => {
    const feel = (drag: number) =>
      computeBrake({ dragBrakePct: drag, initialBrakePct: 0, brakeStrengthPct: 100 }).results.neutralFeel;
    expect(feel(0)).toMatch(/^Free-rolling/);
    expect(feel(8)).toMatch(/^Light drag/);
    expect(feel(25)).toMatch(/^Firm drag/);
    expect(feel(60)).toMatch(/^Heavy drag/);
  });

  it('caps an initial brake above the strength, and says so', () => {
    const { results, warnings } = computeBrake({ dragBrakePct: 0, initialBrakePct: 90, brakeStrengthPct: 60 });
    expect(results.justPastNeutralPct).toBe(60);
    expect(results.points.every((p) => p.brakePct <= 60)).toBe(true);
    expect(warnings.find((w) => w.code === 'initial-above-strength')?.field).toBe('initialBrakePct');
  });

  it('cautions about heavy drag brake heat, deferring to the makers', () => {
    const heavy = computeBrake({ dragBrakePct: 50, initialBrakePct: 50, brakeStrengthPct: 100 }).warnings.find(
      (w) => w.code === 'heavy-drag-brake',
    );
    expect(heavy?.level).toBe('caution');
    expect(heavy?.message).toMatch(/makers' limits/);
    expect(
      computeBrake({ dragBrakePct: 60, initialBrakePct: 0, brakeStrengthPct: 40 }).warnings.map((w) => w.code),
    ).toContain('drag-above-strength');
    expect(computeBrake({ dragBrakePct: 5, initialBrakePct: 10, brakeStrengthPct: 80 }).warnings).toEqual([]);
  });

  it('never gives less brake for more stick and stays within 0..100 (property)', () => {
    const pct = fc.integer({ min: 0, max: 100 });
    fc.assert(
      fc.property(
        pct,
        pct,
        pct,
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        (drag, initial, strength, a, b) => {
          const input = { dragBrakePct: drag, initialBrakePct: initial, brakeStrengthPct: strength };
          const [low, high] = a <= b ? [a, b] : [b, a];
          expect(brakeAtStick(high, input)).toBeGreaterThanOrEqual(brakeAtStick(low, input));
          expect(brakeAtStick(high, input)).toBeLessThanOrEqual(100);
          expect(brakeAtStick(low, input)).toBeGreaterThanOrEqual(drag);
        },
      ),
    );
  });

  it('rejects out-of-range and missing fields, naming each', () => {
    const issues = rejected('brake', { dragBrakePct: 120, initialBrakePct: -1 });
    expect(issueAt(issues, 'dragBrakePct').message).toBe('Drag brake must be at most 100%');
    expect(issueAt(issues, 'initialBrakePct').message).toBe('Initial brake must be at least 0%');
    expect(issueAt(issues, 'brakeStrengthPct').message).toBe('Brake strength is required');
    expect(
      issueAt(
        rejected('brake', { dragBrakePct: 10, initialBrakePct: 15, brakeStrengthPct: 80, dragBreak: 5 }),
        'dragBreak',
      ).message,
    ).toMatch(/Did you mean "dragBrakePct"/);
  });
});

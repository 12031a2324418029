import { z } from 'zod';
import { inputObject, numberInput, optionalNumberInput } from './inputs';
import { roundSig } from './round';
import { defineCalculator } from './types';

// Four verdicts of our own for "is this reading still the motor's reference?", after the guard-band
// idea of ILAC-G8:09/2019 ("Guidelines on Decision Rules and Statements of Conformity"): a reading
// near a tolerance limit is only called clearly inside or outside when its spread leaves no doubt.
//
//   spread ≥ tolerance                      → cant_tell       (the readings scatter as much as the tolerance allows)
//   |delta| ≤ tolerance − guard              → clearly_within  (guard = the larger of the spread and 20 % of the tolerance)
//   tolerance − guard < |delta| ≤ tolerance  → within_close
//   tolerance < |delta| ≤ tolerance + spread → cant_tell       (outside, but the spread reaches back inside)
//   |delta| > tolerance + spread             → clearly_outside

/** The verdicts, from best to worst, with "can't tell" last. */
export const benchVerdicts = ['clearly_within', 'within_close', 'clearly_outside', 'cant_tell'] as const;
/** One of {@link benchVerdicts}. */
export type BenchVerdict = (typeof benchVerdicts)[number];

/** Words the interface uses for each verdict (our own). */
export const BENCH_VERDICT_LABELS: Readonly<Record<BenchVerdict, string>> = {
  clearly_within: 'Clearly within',
  within_close: 'Within, but close',
  clearly_outside: 'Clearly outside',
  cant_tell: "Can't tell",
};

/** Share of the tolerance next to its limit that counts as "close" even when the readings do not scatter. */
export const CLOSE_SHARE = 0.2;

/** Input of a verdict: the change, the tolerance either side of the reference, and the readings' spread (0 when unknown). */
export const verdictInputSchema = z.object({
  delta: z.number().finite(),
  tolerance: z.number().finite().positive(),
  spread: z.number().finite().min(0).default(0),
});

/**
 * The verdict for a change of `delta` against a symmetric `tolerance`, given the readings' `spread`
 * (same unit as delta). Limits belong to the better side: |delta| = tolerance is still within.
 */
export function benchVerdict(delta: number, tolerance: number, spread = 0): BenchVerdict {
  const { delta: d, tolerance: t, spread: s } = verdictInputSchema.parse({ delta, tolerance, spread });
  const size = Math.abs(d);
  if (s >= t) return 'cant_tell';
  const guard = Math.max(s, CLOSE_SHARE * t);
  if (size <= t - guard) return 'clearly_within';
  if (size <= t) return 'within_close';
  if (size <= t + s) return 'cant_tell';
  return 'clearly_outside';
}

/** Input of the verdict calculator: a reference reading, a new one, a tolerance and the readings' spread. */
export const benchVerdictInput = inputObject({
  reference: numberInput({ label: 'Reference reading', unit: '', min: -1_000_000, max: 1_000_000, help: "The motor's reference value for this quantity." }),
  measured: numberInput({
    label: 'New reading',
    unit: '',
    min: -1_000_000,
    max: 1_000_000,
    help: 'The value from the check being judged (the mean of its repeats).',
  }),
  tolerance: numberInput({
    label: 'Tolerance',
    unit: '',
    min: 0.000001,
    max: 1_000_000,
    help: 'How far either side of the reference still counts as the same motor, in the same unit.',
  }),
  spread: optionalNumberInput({
    label: 'Spread of the readings',
    unit: '',
    min: 0,
    max: 1_000_000,
    help: 'Largest minus smallest of the repeat readings; leave empty for a single reading.',
  }),
});

/** The verdict calculator's results. */
export type BenchVerdictResults = { delta: number; deltaPct: number | null; verdict: BenchVerdict; label: string };

/** The verdict calculator: one quantity of a check against its reference. */
export const benchVerdictCalculator = defineCalculator({
  name: 'bench-verdict',
  title: 'Bench check verdict',
  description: 'Whether a new bench reading is clearly within its tolerance of the reference, within but close, clearly outside, or too scattered to tell.',
  input: benchVerdictInput,
  defaults: { reference: 2310, measured: 2265, tolerance: 69.3, spread: 12 },
  compute: (input) => {
    const delta = input.measured - input.reference;
    const verdict = benchVerdict(delta, input.tolerance, input.spread ?? 0);
    const results: BenchVerdictResults = {
      delta: roundSig(delta),
      deltaPct: input.reference === 0 ? null : roundSig((delta / Math.abs(input.reference)) * 100, 4),
      verdict,
      label: BENCH_VERDICT_LABELS[verdict],
    };
    return { results, warnings: [] };
  },
});

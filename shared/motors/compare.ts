import { benchVerdict } from '../calc/bench-verdict';
import type { CompareRow, MotorCompare } from '../schemas/motor';
import { quantityOf, type CheckValues } from './check-values';
import { absoluteTolerance, COMPARED_QUANTITIES, QUANTITY_INFO, type ComparedQuantity, type Tolerance } from './quantities';

/** The tolerance a motor uses for each compared quantity: its own where set, else the default. */
export function effectiveTolerances(overrides: Partial<Record<ComparedQuantity, Tolerance>>): Record<ComparedQuantity, Tolerance> {
  return Object.fromEntries(COMPARED_QUANTITIES.map((q) => [q, overrides[q] ?? QUANTITY_INFO[q].tolerance])) as Record<ComparedQuantity, Tolerance>;
}

/**
 * One row per compared quantity: change from `from` to `to`, the tolerance in the quantity's unit
 * (a percentage is taken of the `from` value), the combined spread of both checks (root sum of squares,
 * as uncertainties of a difference combine) and the verdict; null where either check lacks the quantity.
 */
export function compareChecks(from: CheckValues, to: CheckValues, tolerances: Record<ComparedQuantity, Tolerance>): CompareRow[] {
  return COMPARED_QUANTITIES.map((name) => {
    const info = QUANTITY_INFO[name];
    const a = quantityOf(from, name);
    const b = quantityOf(to, name);
    const base = { name, label: info.label, unit: info.unit, from: a?.value ?? null, to: b?.value ?? null };
    if (!a || !b) return { ...base, delta: null, deltaPct: null, tolerance: null, spread: null, verdict: null };
    const delta = b.value - a.value;
    const tolerance = absoluteTolerance(tolerances[name], a.value);
    const spread = Math.hypot(a.spread, b.spread);
    return {
      ...base,
      delta,
      deltaPct: a.value === 0 ? null : (delta / Math.abs(a.value)) * 100,
      tolerance,
      spread,
      verdict: tolerance > 0 ? benchVerdict(delta, tolerance, spread) : null,
    };
  });
}

type Finding = MotorCompare['findings'][number];

/**
 * What the moves usually mean, in general words (common practice on the bench, no source). A quantity
 * "moved" when it is clearly outside its tolerance; "watch" when it is close or the readings cannot tell.
 */
export function compareFindings(rows: CompareRow[]): Finding[] {
  const by = Object.fromEntries(rows.map((r) => [r.name, r])) as Record<ComparedQuantity, CompareRow>;
  const moved = (q: ComparedQuantity) => by[q].verdict === 'clearly_outside';
  const dir = (q: ComparedQuantity) => Math.sign(by[q].delta ?? 0);
  const out: Finding[] = [];
  if (moved('testVoltageV')) {
    out.push({
      code: 'voltage-differs',
      level: 'info',
      message: 'The two checks were run at different test voltages: compare measured kV rather than speed, and use the same supply next time.',
    });
  }
  if (moved('timingDeg')) {
    out.push({
      code: 'timing-moved',
      level: 'moved',
      message: 'The timing reading moved: the endbell or the sensor board is probably not back where it was. Line the timing marks up again and re-check.',
    });
  }
  if (moved('measuredKv') && dir('measuredKv') > 0 && dir('noLoadCurrentA') < 0) {
    out.push({
      code: 'rotor-weaker',
      level: 'moved',
      message: 'kV went up and no-load current went down: the rotor is weaker or a different one (a rotor changed, or a magnet weakened by heat).',
    });
  } else if (moved('measuredKv')) {
    out.push({ code: 'kv-moved', level: 'moved', message: 'Measured kV moved: check the timing first (timing changes kV on the bench), then the rotor.' });
  }
  if (moved('noLoadCurrentA') && dir('noLoadCurrentA') > 0 && !moved('measuredKv')) {
    out.push({
      code: 'more-drag',
      level: 'moved',
      message: 'No-load current went up with kV steady: usually more friction — bearings, a rotor touching the stator, or a bent shaft.',
    });
  }
  if (moved('resistanceAt20COhm') && dir('resistanceAt20COhm') > 0) {
    out.push({
      code: 'resistance-up',
      level: 'moved',
      message: 'Resistance at 20 °C went up: suspect a winding or a joint — a cracked solder joint, a loose tab or a damaged winding.',
    });
  } else if (moved('resistanceAt20COhm')) {
    out.push({
      code: 'resistance-down',
      level: 'moved',
      message: 'Resistance at 20 °C went down: check the meter leads and contacts first; a real drop can mean shorted turns.',
    });
  }
  if (moved('rotorSymmetryPct'))
    out.push({
      code: 'rotor-symmetry',
      level: 'moved',
      message: 'Rotor symmetry changed: a different rotor, a chipped or shifted magnet, or a rotor sitting off-centre.',
    });
  if (moved('sensorDeviationPct'))
    out.push({ code: 'sensor', level: 'moved', message: 'Sensor-signal deviation changed: look at the sensor board, its seating and the sensor cable.' });
  for (const r of rows) {
    if (r.verdict === 'cant_tell')
      out.push({
        code: `cant-tell-${r.name}`,
        level: 'watch',
        message: `${r.label}: the repeat readings scatter too much to judge. Take more careful repeats before concluding anything.`,
      });
  }
  return out;
}

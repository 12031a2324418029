import { roundSig } from '../calc/round';
import type { SetupRecord } from '../schemas/setup-record';
import { computeSetup, DEFAULT_TIMING_RPM, isHighTiming, sortCautions, type ComputeOptions, type SetupCaution, type SetupComputed } from './computed';
import { flattenSetup, SETUP_FIELDS, SETUP_SECTIONS, labelForSlug, type SetupLeafValue, type SetupSection } from './fields';

/** One field of two records side by side. `a`/`b` are null where that record leaves the field out. */
export type SetupFieldDiff = {
  path: string;
  label: string;
  unit: string;
  section: SetupSection;
  a: SetupLeafValue | null;
  b: SetupLeafValue | null;
  changed: boolean;
};

export type DiffOptions = {
  /** Library names for ESC slugs (otherwise the slug is turned into a label). */
  names?: Readonly<Record<string, string>>;
  /** Provenance differs between any two exports; leave it out unless asked. */
  includeProvenance?: boolean;
};

/**
 * Every field of two setup records side by side with a changed flag, in section order; ESC
 * settings are the union of both records' slugs. Either record may be null (no baseline yet),
 * which is what a review diff needs when a revision adds or removes its baseline.
 */
export function diffSetupFields(a: SetupRecord | null, b: SetupRecord | null, opts: DiffOptions = {}): SetupFieldDiff[] {
  const leavesA = new Map((a ? flattenSetup(a, opts.names) : []).map((l) => [l.path, l]));
  const leavesB = new Map((b ? flattenSetup(b, opts.names) : []).map((l) => [l.path, l]));
  const rows: SetupFieldDiff[] = [];
  const push = (path: string, label: string, unit: string, section: SetupSection) => {
    const va = leavesA.get(path)?.value ?? null;
    const vb = leavesB.get(path)?.value ?? null;
    rows.push({ path, label, unit, section, a: va, b: vb, changed: va !== vb });
  };
  for (const section of SETUP_SECTIONS) {
    if (section.key === 'provenance' && !opts.includeProvenance) continue;
    if (section.key === 'escSettings') {
      const slugs = [...new Set([...leavesA.keys(), ...leavesB.keys()].filter((p) => p.startsWith('escSettings.')))]
        .map((p) => p.slice('escSettings.'.length))
        .sort();
      for (const slug of slugs) {
        const path = `escSettings.${slug}`;
        push(path, labelForSlug(slug, opts.names), leavesA.get(path)?.unit ?? leavesB.get(path)?.unit ?? '', 'escSettings');
      }
      continue;
    }
    for (const f of SETUP_FIELDS.filter((x) => x.section === section.key)) {
      // Optional fields that neither record uses are noise in a side-by-side table.
      if (!leavesA.has(f.path) && !leavesB.has(f.path)) continue;
      push(f.path, f.label, f.unit, f.section);
    }
  }
  return rows;
}

/** A computed value of both records and the change from A to B. */
export type SetupDelta = { key: string; label: string; unit: string; a: number | null; b: number | null; delta: number | null };

/** A caution in a comparison: which record it is about, or `b` for one raised by the change from A to B. */
export type CompareCaution = SetupCaution & { side: 'a' | 'b' };

export type SetupComparison = {
  fields: SetupFieldDiff[];
  differences: SetupFieldDiff[];
  computed: { a: SetupComputed; b: SetupComputed };
  deltas: SetupDelta[];
  cautions: CompareCaution[];
  atRpm: number;
};

function delta(key: string, label: string, unit: string, a: number | null | undefined, b: number | null | undefined): SetupDelta {
  const va = a ?? null;
  const vb = b ?? null;
  return { key, label, unit, a: va, b: vb, delta: va === null || vb === null ? null : roundSig(vb - va, 4) };
}

/** The computed deltas a racer asks about first: ratio, rollout, top speed, timing at the chosen rpm, pack cutoff. */
export function computedDeltas(a: SetupComputed, b: SetupComputed, atRpm: number): SetupDelta[] {
  return [
    delta('finalDriveRatio', 'Final drive ratio', ':1', a.gearing?.finalDriveRatio, b.gearing?.finalDriveRatio),
    delta('rolloutMm', 'Rollout', 'mm', a.gearing?.rolloutMm, b.gearing?.rolloutMm),
    delta('noLoadRpm', 'No-load motor speed', 'rpm', a.motor?.noLoadRpm, b.motor?.noLoadRpm),
    delta('loadedKmh', 'Estimated top speed', 'km/h', a.speed?.loadedKmh, b.speed?.loadedKmh),
    delta('totalTimingDeg', `Total timing at ${atRpm.toLocaleString('en-GB')} rpm`, 'deg', a.timing?.totalDeg, b.timing?.totalDeg),
    delta('cutoffPerCellV', 'Low-voltage cutoff per cell', 'V', a.pack?.cutoffPerCellV, b.pack?.cutoffPerCellV),
    delta('cutoffV', 'Low-voltage cutoff, pack', 'V', a.pack?.cutoffV, b.pack?.cutoffV),
  ];
}

/**
 * Whether a record's own words warn of heat: its notes or layout name a motor or controller temperature
 * of 60 °C (140 °F) or more, or speak of heat ("hot", "heat", "overheating"), or its conditions were
 * hot (air from 30 °C, track from 40 °C). Thresholds: common practice, no source (60 °C is where the
 * temperature calculator's motor band turns from cool towards warm and hot; see shared/calc/temperature.ts).
 */
export function notesHeat(record: SetupRecord): boolean {
  const text = [record.notes, record.conditions?.layout].filter(Boolean).join(' ');
  for (const m of text.matchAll(/(\d{2,3}(?:[.,]\d+)?)\s*°\s*([CF])\b/g)) {
    const v = Number(m[1].replace(',', '.'));
    if ((m[2] === 'C' && v >= 60) || (m[2] === 'F' && v >= 140)) return true;
  }
  if (/\b(hot|heat|overheat\w*)\b/i.test(text)) return true;
  const c = record.conditions;
  return (c?.ambientTempC ?? -Infinity) >= 30 || (c?.trackTempC ?? -Infinity) >= 40;
}

/** Cautions raised by moving from A to B, beyond each record's own. */
function changeCautions(a: SetupComputed, b: SetupComputed, recA?: SetupRecord, recB?: SetupRecord): CompareCaution[] {
  const out: CompareCaution[] = [];
  const ta = a.timing?.totalDeg;
  const tb = b.timing?.totalDeg;
  const ra = a.gearing?.rolloutMm;
  const rb = b.gearing?.rolloutMm;
  if (ta !== undefined && tb !== undefined && ra !== undefined && rb !== undefined) {
    const moreTiming = tb - ta >= 2 || (isHighTiming(b.timing) && tb >= ta);
    // Taller gearing = longer rollout (a numerically lower final drive ratio): more load per motor turn.
    const taller = rb > ra * 1.01;
    if (moreTiming && taller) {
      out.push({
        level: 'caution',
        code: 'heat-timing-and-gearing',
        source: 'compare',
        side: 'b',
        field: 'gearing.pinionTeeth',
        message:
          `B runs ${roundSig(tb, 3)}° of total timing at ${b.timing!.atRpm.toLocaleString('en-GB')} rpm (A: ${roundSig(ta, 3)}°) on taller gearing (rollout ${ra} → ${rb} mm). ` +
          'More timing and taller gearing both heat the motor and controller, and together they add up fast. Change one at a time, check the motor a few minutes into the run, ' +
          "gear down if it climbs, and stay within the motor and controller makers' limits.",
      });
    }
  }
  // A bigger pinion on a setup whose notes warn of heat: say so even when the timing stays put.
  const pa = recA?.gearing?.pinionTeeth;
  const pb = recB?.gearing?.pinionTeeth;
  if (recA && recB && pa !== undefined && pb !== undefined && pb > pa && !out.some((c) => c.code === 'heat-timing-and-gearing')) {
    const who = notesHeat(recA) ? 'A' : notesHeat(recB) ? 'B' : null;
    if (who) {
      out.push({
        level: 'caution',
        code: 'heat-pinion-up',
        source: 'compare',
        side: 'b',
        field: 'gearing.pinionTeeth',
        message:
          `B goes up from a ${pa}- to a ${pb}-tooth pinion, and ${who}'s notes warn of high temperatures. A bigger pinion loads the motor more on every lap: ` +
          'go up one tooth at a time, check the motor and controller temperature a few minutes into the run, gear back down if it climbs, ' +
          "and stay within the motor and controller makers' limits.",
      });
    }
  }
  const ca = a.pack?.cutoffPerCellV;
  const cb = b.pack?.cutoffPerCellV;
  if (ca !== null && ca !== undefined && cb !== null && cb !== undefined && cb < ca && b.pack?.cutoffCheck !== 'below-window') {
    out.push({
      level: 'info',
      code: 'cutoff-lowered',
      source: 'compare',
      side: 'b',
      field: 'escSettings.low-voltage-cutoff',
      message: `B lowers the cutoff from ${ca.toFixed(2)} V to ${cb.toFixed(2)} V per cell: a little more run time for a deeper discharge. Stay inside the pack maker's limits.`,
    });
  }
  return out;
}

/**
 * Compares two setup records: every field side by side, the computed deltas (final drive ratio,
 * rollout, estimated top speed, total timing at the chosen rpm, pack cutoff) and the cautions of
 * each record plus those raised by the change itself.
 */
export function compareSetups(a: SetupRecord, b: SetupRecord, opts: ComputeOptions & DiffOptions = {}): SetupComparison {
  const ca = computeSetup(a, opts);
  const cb = computeSetup(b, opts);
  const fields = diffSetupFields(a, b, opts);
  const atRpm = opts.atRpm ?? DEFAULT_TIMING_RPM;
  const own = (side: 'a' | 'b', c: SetupComputed): CompareCaution[] => c.cautions.filter((x) => x.level !== 'info').map((x) => ({ ...x, side }));
  return {
    fields,
    differences: fields.filter((f) => f.changed),
    computed: { a: ca, b: cb },
    deltas: computedDeltas(ca, cb, atRpm),
    cautions: sortCautions([...own('b', cb), ...changeCautions(ca, cb, a, b), ...own('a', ca)]),
    atRpm,
  };
}

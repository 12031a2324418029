import { finalDriveRatio } from '../calc/gearing';
import type { SetupRecord } from '../schemas/setup-record';

/** Gearing more than this much taller (rollout up by more than 5 %) needs a second moderator. */
export const TALLER_GEARING_LIMIT = 0.05;

/** Why a proposal needs two moderators: the rule, what it says, and the baseline field concerned. */
export type SafetyChange = { rule: string; message: string; path: string };

const TIMING: Array<[slug: string, label: string]> = [
  ['static-timing', 'static timing'],
  ['ramped-advance', 'ramped advance'],
  ['full-throttle-advance', 'full-throttle advance'],
];

const fmt = (v: number) => String(Number(v.toPrecision(4)));

/**
 * The safety-relevant changes a proposal's baseline makes against the live one: a lower low-voltage
 * cutoff, thermal protection or a current limit raised or taken out, more timing (static, ramped or
 * full-throttle), or gearing taller by more than 5 % (rollout, so a larger tyre counts too). Each one
 * means the proposal needs two different moderators, neither of them its author. A guide without a live
 * baseline has nothing to compare against, so it needs the usual one.
 */
export function safetyRelevantChanges(live: SetupRecord | null, proposed: SetupRecord | null): SafetyChange[] {
  if (!live || !proposed) return [];
  const found: SafetyChange[] = [];
  const before = (slug: string) => live.escSettings[slug]?.value;
  const after = (slug: string) => proposed.escSettings[slug]?.value;

  const cutoffA = before('low-voltage-cutoff');
  const cutoffB = after('low-voltage-cutoff');
  if (cutoffA !== undefined && (cutoffB === undefined || cutoffB < cutoffA)) {
    found.push({
      rule: 'lower-cutoff',
      path: 'escSettings.low-voltage-cutoff',
      message:
        cutoffB === undefined
          ? `Removes the low-voltage cutoff (was ${fmt(cutoffA)} V per cell).`
          : `Lowers the low-voltage cutoff from ${fmt(cutoffA)} to ${fmt(cutoffB)} V per cell.`,
    });
  }
  for (const [slug, label, unit] of [
    ['thermal-protection', 'thermal protection', '°C'],
    ['current-limit', 'the current limit', 'A'],
  ] as const) {
    const a = before(slug);
    const b = after(slug);
    if (a === undefined) continue;
    if (b === undefined) found.push({ rule: `raise-${slug}`, path: `escSettings.${slug}`, message: `Takes out ${label} (was ${fmt(a)} ${unit}).` });
    else if (b > a) found.push({ rule: `raise-${slug}`, path: `escSettings.${slug}`, message: `Raises ${label} from ${fmt(a)} to ${fmt(b)} ${unit}.` });
  }
  for (const [slug, label] of TIMING) {
    const a = before(slug) ?? 0;
    const b = after(slug) ?? 0;
    if (b > a) found.push({ rule: 'raise-timing', path: `escSettings.${slug}`, message: `Raises ${label} from ${fmt(a)}° to ${fmt(b)}°.` });
  }
  const rollout = (s: SetupRecord) =>
    (Math.PI * s.gearing.tyreDiameterMm) / finalDriveRatio(s.gearing.spurTeeth, s.gearing.pinionTeeth, s.gearing.internalRatio);
  const ra = rollout(live);
  const rb = rollout(proposed);
  if (rb > ra * (1 + TALLER_GEARING_LIMIT)) {
    found.push({
      rule: 'taller-gearing',
      path: 'gearing.pinionTeeth',
      message: `Makes the gearing ${(((rb - ra) / ra) * 100).toFixed(1)} % taller (rollout ${fmt(ra)} → ${fmt(rb)} mm), more than ${TALLER_GEARING_LIMIT * 100} %.`,
    });
  }
  return found;
}

import { CLASSES } from '../constants';
import { finalDriveRatio } from '../calc/gearing';
import { classRanges } from './class-ranges';
import { formatValue, type CheckLibraryEntry, type CheckSubject, type ContentCheck } from './types';

/**
 * Rule `baseline-in-class-range`: every numeric baseline value lies inside the library's typical range
 * for the guide's class (the entry's "Typical settings by class" table), or is flagged with that range.
 * Also the final drive ratio, rollout and kV, which the record holds in its own fields. A warning: a
 * typical range is a starting point, not a rule.
 */
export function baselineInClassRange(subject: CheckSubject, library: CheckLibraryEntry[]): ContentCheck[] {
  const setup = subject.setup;
  const cls = subject.class ?? setup?.vehicle.class;
  if (!setup || !cls) return [];
  const className = CLASSES.find((c) => c.slug === cls)?.name ?? cls;
  const bySlug = new Map(library.map((e) => [e.slug, e]));
  const values: Array<{ slug: string; path: string; value: number }> = [];
  for (const [slug, setting] of Object.entries(setup.escSettings)) {
    if (bySlug.get(slug)?.unit) values.push({ slug, path: `escSettings.${slug}`, value: setting.value });
  }
  const g = setup.gearing;
  const ratio = finalDriveRatio(g.spurTeeth, g.pinionTeeth, g.internalRatio);
  values.push({ slug: 'final-drive-ratio', path: 'gearing.pinionTeeth', value: ratio });
  values.push({ slug: 'rollout', path: 'gearing.pinionTeeth', value: (Math.PI * g.tyreDiameterMm) / ratio });
  if (setup.motor.kvRpmPerV !== undefined) values.push({ slug: 'motor-kv', path: 'motor.kvRpmPerV', value: setup.motor.kvRpmPerV });

  const found: ContentCheck[] = [];
  for (const { slug, path, value } of values) {
    const entry = bySlug.get(slug);
    const range = entry && classRanges(entry).get(cls);
    if (!entry || !range) continue;
    // Half a step of slack for values the record rounds (a ratio of 6.825 against a stated 6.8).
    const slack = (range.max - range.min) * 0.005;
    if (value >= range.min - slack && value <= range.max + slack) continue;
    const unit = entry.unit ? ` ${entry.unit}` : '';
    found.push({
      rule: 'baseline-in-class-range',
      severity: 'warning',
      path,
      message: `${entry.name} ${formatValue(Number(value.toPrecision(4)))}${unit} is outside the library's typical range for ${className} (${range.text}). Check it, or say in the text why this setup differs.`,
    });
  }
  return found;
}

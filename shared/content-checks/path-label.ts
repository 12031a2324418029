import { calculatorNames, getCalculator } from '../calc/registry';
import { labelForSlug, SETUP_FIELD_BY_PATH } from '../setup/fields';

const inputLabels = new Map<string, string>();
for (const name of calculatorNames) for (const f of getCalculator(name)!.fields) if (!inputLabels.has(f.key)) inputLabels.set(f.key, f.label);

/**
 * A finding's place in words, for its title: "Worked example 3 · Throttle curve (expo)",
 * "Baseline · Drag brake", "Baseline · Pinion". Never the internal key (`expoPct`, `escSettings.drag-brake`).
 * `names` gives the library's names by slug, when the caller has them.
 */
export function checkPathLabel(path: string, names?: Readonly<Record<string, string>>): string {
  const example = /^examples\[(\d+)\](?:\.(.+))?$/.exec(path);
  if (example) {
    const field = example[2] ? (inputLabels.get(example[2]) ?? 'an input') : null;
    return `Worked example ${Number(example[1]) + 1}${field ? ` · ${field}` : ''}`;
  }
  if (path.startsWith('escSettings.')) return `Baseline · ${labelForSlug(path.slice('escSettings.'.length), names)}`;
  const field = SETUP_FIELD_BY_PATH.get(path);
  if (field) return `Baseline · ${field.label}`;
  if (path === '' || path === 'body') return 'Text';
  return path.charAt(0).toUpperCase() + path.slice(1).replace(/[-_.]/g, ' ');
}

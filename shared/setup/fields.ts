import type { EscSetting, SetupRecord } from '../schemas/setup-record';

/** How a leaf value is written as text (CSV) and read back. */
export type SetupFieldType = 'number' | 'integer' | 'boolean' | 'string' | 'enum';

/** One leaf field of a setup record (escSettings entries are listed separately, per slug). */
export type SetupFieldDef = { path: string; label: string; unit: string; type: SetupFieldType; section: SetupSection };

export type SetupSection = 'vehicle' | 'motor' | 'escSettings' | 'gearing' | 'battery' | 'conditions' | 'notes' | 'provenance';

/** Section titles in reading order. */
export const SETUP_SECTIONS: { key: SetupSection; title: string }[] = [
  { key: 'vehicle', title: 'Vehicle' },
  { key: 'motor', title: 'Motor' },
  { key: 'escSettings', title: 'ESC settings' },
  { key: 'gearing', title: 'Gearing' },
  { key: 'battery', title: 'Battery' },
  { key: 'conditions', title: 'Conditions' },
  { key: 'notes', title: 'Notes' },
  { key: 'provenance', title: 'Provenance' },
];

/** Every fixed leaf field, in the order exports and comparisons list them. */
export const SETUP_FIELDS: readonly SetupFieldDef[] = [
  { path: 'vehicle.class', label: 'Class', unit: '', type: 'enum', section: 'vehicle' },
  { path: 'vehicle.chassis', label: 'Chassis', unit: '', type: 'string', section: 'vehicle' },
  { path: 'vehicle.drivetrain', label: 'Drivetrain', unit: '', type: 'enum', section: 'vehicle' },
  { path: 'motor.kvRpmPerV', label: 'Motor kV', unit: 'rpm/V', type: 'number', section: 'motor' },
  { path: 'motor.windTurns', label: 'Wind', unit: 'turns', type: 'number', section: 'motor' },
  { path: 'motor.poles', label: 'Rotor poles', unit: 'poles', type: 'integer', section: 'motor' },
  { path: 'motor.sensored', label: 'Sensored', unit: '', type: 'boolean', section: 'motor' },
  { path: 'motor.endbellTimingDeg', label: 'Endbell timing', unit: 'deg', type: 'number', section: 'motor' },
  { path: 'motor.registeredMotorId', label: 'Registered motor', unit: '', type: 'string', section: 'motor' },
  { path: 'gearing.spurTeeth', label: 'Spur', unit: 'teeth', type: 'integer', section: 'gearing' },
  { path: 'gearing.pinionTeeth', label: 'Pinion', unit: 'teeth', type: 'integer', section: 'gearing' },
  { path: 'gearing.internalRatio', label: 'Internal ratio', unit: ':1', type: 'number', section: 'gearing' },
  { path: 'gearing.tyreDiameterMm', label: 'Tyre diameter', unit: 'mm', type: 'number', section: 'gearing' },
  { path: 'battery.chemistry', label: 'Chemistry', unit: '', type: 'enum', section: 'battery' },
  { path: 'battery.cells', label: 'Cells in series', unit: 'S', type: 'integer', section: 'battery' },
  { path: 'battery.capacityMah', label: 'Capacity', unit: 'mAh', type: 'integer', section: 'battery' },
  { path: 'conditions.surface', label: 'Surface', unit: '', type: 'enum', section: 'conditions' },
  { path: 'conditions.layout', label: 'Layout', unit: '', type: 'string', section: 'conditions' },
  { path: 'conditions.ambientTempC', label: 'Ambient temperature', unit: '°C', type: 'number', section: 'conditions' },
  { path: 'conditions.trackTempC', label: 'Track temperature', unit: '°C', type: 'number', section: 'conditions' },
  { path: 'notes', label: 'Notes', unit: '', type: 'string', section: 'notes' },
  { path: 'provenance.guideSlug', label: 'Guide', unit: '', type: 'string', section: 'provenance' },
  { path: 'provenance.guideTitle', label: 'Guide title', unit: '', type: 'string', section: 'provenance' },
  { path: 'provenance.revisionNumber', label: 'Version', unit: '', type: 'integer', section: 'provenance' },
  { path: 'provenance.authorDisplayName', label: 'Author', unit: '', type: 'string', section: 'provenance' },
  { path: 'provenance.exportedAt', label: 'Exported at', unit: '', type: 'string', section: 'provenance' },
];

export const SETUP_FIELD_BY_PATH: ReadonlyMap<string, SetupFieldDef> = new Map(SETUP_FIELDS.map((f) => [f.path, f]));

/** A leaf value of a record: what a cell of a comparison or a CSV row holds. */
export type SetupLeafValue = string | number | boolean;

/** Reads a dotted path (two levels at most) from a record; undefined when absent. */
export function readSetupPath(record: SetupRecord, path: string): SetupLeafValue | undefined {
  const [head, tail] = path.split('.', 2) as [string, string | undefined];
  const top = (record as Record<string, unknown>)[head];
  if (tail === undefined) return top as SetupLeafValue | undefined;
  if (top === null || typeof top !== 'object') return undefined;
  return (top as Record<string, unknown>)[tail] as SetupLeafValue | undefined;
}

/** One leaf of a record, flattened: fixed fields by path, then ESC settings as `escSettings.<slug>`. */
export type SetupLeaf = { path: string; label: string; unit: string; value: SetupLeafValue; section: SetupSection };

/** Turns an ESC slug into a readable label when the library name is not at hand. */
export function labelForSlug(slug: string, names?: Readonly<Record<string, string>>): string {
  if (names?.[slug]) return names[slug];
  const words = slug.replace(/-/g, ' ');
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/** Flattens a record into its present leaves (absent optional fields are left out). */
export function flattenSetup(record: SetupRecord, names?: Readonly<Record<string, string>>): SetupLeaf[] {
  const leaves: SetupLeaf[] = [];
  for (const f of SETUP_FIELDS) {
    if (f.section === 'escSettings') continue;
    const value = readSetupPath(record, f.path);
    if (value === undefined) continue;
    leaves.push({ path: f.path, label: f.label, unit: f.unit, value, section: f.section });
  }
  const esc = Object.keys(record.escSettings)
    .sort()
    .map((slug): SetupLeaf => {
      const s: EscSetting = record.escSettings[slug];
      return { path: `escSettings.${slug}`, label: labelForSlug(slug, names), unit: s.unit, value: s.value, section: 'escSettings' };
    });
  const order = SETUP_SECTIONS.map((s) => s.key);
  return [...leaves, ...esc].sort((a, b) => order.indexOf(a.section) - order.indexOf(b.section));
}

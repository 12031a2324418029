import type { SetupRecord } from '@shared/schemas/setup-record';
import { labelForSlug, readSetupPath, SETUP_FIELDS, type SetupLeafValue } from '@shared/setup/fields';

/** One field a loaded file changed: its label, unit, and the values before and after (null = absent). */
export type FileChange = { path: string; label: string; unit: string; before: SetupLeafValue | null; after: SetupLeafValue | null };

const present = (v: unknown): SetupLeafValue | null =>
  v === undefined || v === null || v === '' || (typeof v === 'number' && Number.isNaN(v)) ? null : (v as SetupLeafValue);

/**
 * What filling the form from a file changed: every fixed field and ESC setting whose value differs
 * between the form as it was (possibly half filled) and the file's record, in reading order.
 */
export function fileChanges(before: unknown, after: SetupRecord, names?: Readonly<Record<string, string>>): FileChange[] {
  const prev = (before ?? {}) as SetupRecord;
  const changes: FileChange[] = [];
  for (const f of SETUP_FIELDS) {
    if (f.section === 'provenance') continue;
    const a = present(readSetupPath(prev, f.path));
    const b = present(readSetupPath(after, f.path));
    if (a !== b) changes.push({ path: f.path, label: f.label, unit: f.unit, before: a, after: b });
  }
  const prevEsc = (prev.escSettings ?? {}) as Record<string, { value?: unknown; unit?: string } | undefined>;
  const slugs = [...new Set([...Object.keys(prevEsc), ...Object.keys(after.escSettings)])].sort();
  for (const slug of slugs) {
    const a = present(prevEsc[slug]?.value);
    const b = present(after.escSettings[slug]?.value);
    if (a !== b)
      changes.push({
        path: `escSettings.${slug}`,
        label: labelForSlug(slug, names),
        unit: after.escSettings[slug]?.unit ?? prevEsc[slug]?.unit ?? '',
        before: a,
        after: b,
      });
  }
  return changes;
}

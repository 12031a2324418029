import type { SetupRecord } from '../../../shared/schemas/setup-record';
import { describeMotor, type SetupBaseline, type SetupSummary, type SetupUpload } from '../../../shared/schemas/setup';
import { computeSetup } from '../../../shared/setup/computed';
import { chemistryVoltages } from '../../../shared/calc/chemistry';
import type { SetupEntity } from './setup.entity';

/** Class, surface, motor, ratio, rollout and pack of a record, for lists. */
export function presentSummary(record: SetupRecord): SetupSummary {
  const computed = computeSetup(record);
  return {
    class: record.vehicle.class,
    surface: record.conditions.surface,
    motor: describeMotor(record),
    finalDriveRatio: computed.gearing?.finalDriveRatio ?? null,
    rolloutMm: computed.gearing?.rolloutMm ?? null,
    pack: `${record.battery.cells}S ${chemistryVoltages[record.battery.chemistry].label}`,
  };
}

export function presentUpload(row: SetupEntity): SetupUpload {
  const record = row.record as SetupRecord;
  return {
    id: row.id,
    originalName: row.originalName,
    format: row.fileFormat,
    byteSize: row.byteSize,
    createdAt: row.createdAt.toISOString(),
    summary: presentSummary(record),
    record,
  };
}

export function presentUploadListItem(row: SetupEntity): Omit<SetupUpload, 'record'> {
  const { record: _record, ...rest } = presentUpload(row);
  return rest;
}

export function presentBaseline(b: {
  slug: string;
  number: number;
  title: string;
  record: SetupRecord;
  publishedAt: Date | null;
  authorDisplayName: string;
}): SetupBaseline {
  return {
    guideSlug: b.slug,
    guideTitle: b.title,
    revisionNumber: b.number,
    authorDisplayName: b.authorDisplayName,
    publishedAt: b.publishedAt ? new Date(b.publishedAt).toISOString() : null,
    summary: presentSummary(b.record),
  };
}

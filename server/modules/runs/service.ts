import { In, type DataSource, type EntityManager } from 'typeorm';
import { computeRunFigures, withRunContext, type RunContext, type RunFigures } from '../../../shared/runlog/figures';
import { encodeColumnar, decodeColumnar } from '../../../shared/runlog/columnar';
import { proposeMapping, type RunMapping } from '../../../shared/runlog/mapping';
import { parseTable } from '../../../shared/runlog/parse';
import { crossCorrelationOffset } from '../../../shared/runlog/align';
import { bucketMinMax, firstSustainedFullThrottle } from '../../../shared/runlog/series';
import { readTable } from '../../../shared/runlog/table';
import { RUNLOG_LIMITS, VALUE_CHANNELS } from '../../../shared/runlog/vocabulary';
import type { SetupRecord } from '../../../shared/schemas/setup-record';
import type { RunCompare, RunPatch, RunPreview } from '../../../shared/schemas/run';
import type { AppContext } from '../../context';
import { AppError, notFound, validationFailed } from '../../lib/errors';
import { newStorageKey } from '../../lib/storage';
import { SetupEntity } from '../setups/setup.entity';
import { MotorEntity } from '../motors/motor.entity';
import { ownsMotor } from '../motors/service';
import type { RunLabels } from './presenter';
import { canReadRun } from './policy';
import { RunEntity } from './run.entity';
import { problemError, readRunFile } from './upload';

type Db = DataSource | EntityManager;
export type RunFields = { title?: string; setupId?: string; motorId?: string; mapping?: RunMapping };

/** The figures' context from a setup record: the pack for per-cell voltage, the gearing for road speed. */
export function contextOf(record: SetupRecord | null | undefined): RunContext {
  if (!record) return {};
  return { battery: { chemistry: record.battery.chemistry, cells: record.battery.cells }, gearing: record.gearing };
}

/** One of the caller's own uploaded setups; anything else is a validation problem that reveals nothing. */
async function ownSetup(db: Db, ownerId: string, setupId: string | undefined) {
  if (!setupId) return null;
  const setup = await db.getRepository(SetupEntity).findOneBy({ id: setupId, ownerId });
  if (!setup) throw validationFailed([{ path: 'body.setupId', message: 'None of your uploaded setups has that id' }]);
  return setup;
}

/** One of the caller's registered motors, checked like the setup (a validation problem that reveals nothing). */
async function ownMotorId(db: Db, ownerId: string, motorId: string | undefined) {
  if (!motorId) return null;
  if (!(await ownsMotor(db, ownerId, motorId))) throw validationFailed([{ path: 'body.motorId', message: 'None of your registered motors has that id' }]);
  return motorId;
}

/** Reads, maps and parses an upload without storing anything: the first rows, the mapping and, if it reads, the figures. */
export async function previewRun(ctx: AppContext, ownerId: string, file: Express.Multer.File | undefined, fields: RunFields): Promise<RunPreview> {
  const { text, legacyEncoding } = readRunFile(file);
  const read = readTable(text);
  if (!read.ok) throw problemError(read.status, read.problem);
  const { table } = read;
  const proposal = proposeMapping(table.headers);
  const mapping = fields.mapping ?? proposal.mapping;
  const setup = await ownSetup(ctx.dataSource, ownerId, fields.setupId);
  const parsed = parseTable(table, fields.mapping);
  const notes = parsed.ok ? parsed.run.notes : table.notes;
  if (legacyEncoding) notes.unshift({ code: 'encoding', message: 'The file is not UTF-8; it was read as Windows-1252 text.' });
  return {
    headers: table.headers,
    rows: table.rows.slice(0, RUNLOG_LIMITS.previewRows),
    mapping: mapping as RunPreview['mapping'],
    ours: proposal.ours,
    delimiter: table.delimiter,
    decimalComma: table.decimalComma,
    rowCount: table.rows.length,
    notes,
    problem: parsed.ok ? null : parsed.problem,
    summary: parsed.ok ? computeRunFigures(parsed.run.time, parsed.run.channels, parsed.run.gaps, contextOf(setup?.record as SetupRecord | undefined)) : null,
  };
}

const stem = (name: string) => name.replace(/\.csv$/i, '').slice(0, RUNLOG_LIMITS.titleMax) || 'Run';

/**
 * Parses an upload, computes its figures and stores it: the raw file and the columns first, then the row in a
 * transaction; if the row cannot be written both objects are removed, so nothing is left from a failed upload.
 */
export async function createRun(ctx: AppContext, ownerId: string, file: Express.Multer.File | undefined, fields: RunFields & { demo?: boolean }) {
  const { displayName, text, legacyEncoding } = readRunFile(file);
  const setup = await ownSetup(ctx.dataSource, ownerId, fields.setupId);
  const motorId = await ownMotorId(ctx.dataSource, ownerId, fields.motorId);
  const parsed = parseTable(
    (() => {
      const read = readTable(text);
      if (!read.ok) throw problemError(read.status, read.problem);
      return read.table;
    })(),
    fields.mapping,
  );
  if (!parsed.ok) throw problemError(parsed.status, parsed.problem);
  const { run } = parsed;
  if (legacyEncoding) run.notes.unshift({ code: 'encoding', message: 'The file is not UTF-8; it was read as Windows-1252 text.' });
  const summary = computeRunFigures(run.time, run.channels, run.gaps, contextOf(setup?.record as SetupRecord | undefined));
  const data = encodeColumnar(run.time, run.channels);
  return storeRun(ctx, {
    ownerId,
    setupId: setup?.id ?? null,
    motorId,
    title: fields.title?.trim() || stem(displayName),
    originalName: displayName,
    raw: file!.buffer,
    data,
    channels: ['time_s', ...VALUE_CHANNELS.filter((c) => run.channels[c])],
    mapping: run.mapping,
    importNotes: run.notes,
    gaps: run.gaps,
    summary,
    demo: fields.demo ?? false,
  });
}

type NewRun = Omit<RunEntity, 'id' | 'createdAt' | 'rawKey' | 'dataKey' | 'dataBytes' | 'byteSize' | 'summary' | 'mapping'> & {
  raw: Buffer;
  data: Uint8Array;
  summary: RunFigures;
  mapping: RunMapping;
};

/** Objects first, row second (see createRun); the demo seed passes its own transaction's manager. */
export async function storeRun(ctx: Pick<AppContext, 'storage' | 'dataSource' | 'logger'>, r: NewRun, manager?: EntityManager) {
  const rawKey = newStorageKey('runs', 'csv');
  const dataKey = newStorageKey('runs', 'bin');
  const { raw, data, ...fields } = r;
  const save = (m: EntityManager) =>
    m.getRepository(RunEntity).save(m.getRepository(RunEntity).create({ ...fields, rawKey, dataKey, dataBytes: data.byteLength, byteSize: raw.length }));
  try {
    await ctx.storage.put(rawKey, raw, 'text/csv; charset=utf-8');
    await ctx.storage.put(dataKey, Buffer.from(data.buffer, data.byteOffset, data.byteLength), 'application/octet-stream');
    return manager ? await save(manager) : await ctx.dataSource.transaction(save);
  } catch (err) {
    for (const key of [rawKey, dataKey])
      await ctx.storage.delete(key).catch((e) => ctx.logger.error({ err: e, key }, 'could not remove an orphaned run object'));
    throw err;
  }
}

export async function listRuns(db: Db, ownerId: string) {
  return db.getRepository(RunEntity).find({ where: { ownerId }, order: { createdAt: 'DESC' } });
}

/** A run its owner may read; anyone else gets 404, so ids reveal nothing. */
export async function getRun(db: Db, user: { id: string } | null, id: string) {
  const row = await db.getRepository(RunEntity).findOneBy({ id });
  if (!row || !(await canReadRun(db, user, row))) throw notFound('That run');
  return row;
}

/** The setups (display name and gearing) and motors (label) the runs point at. */
export async function runLabels(db: Db, runs: RunEntity[]): Promise<RunLabels> {
  const setupIds = [...new Set(runs.map((r) => r.setupId).filter((x): x is string => !!x))];
  const motorIds = [...new Set(runs.map((r) => r.motorId).filter((x): x is string => !!x))];
  const setups = setupIds.length ? await db.getRepository(SetupEntity).findBy({ id: In(setupIds) }) : [];
  const motors = motorIds.length ? await db.getRepository(MotorEntity).findBy({ id: In(motorIds) }) : [];
  return {
    setups: new Map(setups.map((s) => [s.id, { label: s.originalName, gearing: (s.record as SetupRecord).gearing }])),
    motors: new Map(motors.map((m) => [m.id, m.label])),
  };
}

/**
 * Changes what the owner may change after upload: the title, the setup the run was on and the registered motor it
 * used. A setup or motor that is not the caller's own is answered 404 exactly as a missing one, so ids reveal
 * nothing. Attaching or detaching a setup works the setup-dependent figures out again (road speed, per-cell
 * voltage, cautions) from the stored figures, in the same transaction as the link.
 */
export async function updateRun(ctx: AppContext, user: { id: string }, id: string, patch: RunPatch) {
  return ctx.dataSource.transaction(async (m) => {
    const repo = m.getRepository(RunEntity);
    const row = await repo.findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!row || row.ownerId !== user.id) throw notFound('That run');
    if (patch.title !== undefined) row.title = patch.title;
    if (patch.motorId !== undefined) {
      if (patch.motorId !== null && !(await ownsMotor(m, user.id, patch.motorId))) throw notFound('That motor');
      row.motorId = patch.motorId;
    }
    if (patch.setupId !== undefined) {
      const setup = patch.setupId === null ? null : await m.getRepository(SetupEntity).findOneBy({ id: patch.setupId, ownerId: user.id });
      if (patch.setupId !== null && !setup) throw notFound('That setup');
      row.setupId = setup?.id ?? null;
      row.summary = withRunContext(row.summary as RunFigures, contextOf(setup?.record as SetupRecord | undefined));
    }
    return repo.save(row);
  });
}

/** Deletes a run: the row first (so nothing points at a missing object), then both stored objects. */
export async function deleteRun(ctx: AppContext, user: { id: string }, id: string) {
  const row = await getRun(ctx.dataSource, user, id);
  if (row.ownerId !== user.id) throw notFound('That run');
  const [offered] = await ctx.dataSource.query(
    `SELECT 1 FROM run_evidence e JOIN revisions r ON r.id = e.revision_id WHERE e.run_id = $1 AND r.state NOT IN ('draft', 'returned') LIMIT 1`,
    [row.id],
  );
  // A guide's reviewed or live version keeps the evidence it was judged on.
  if (offered) throw new AppError(409, 'run_is_evidence', 'This run is evidence on a guide version under review or published; it cannot be deleted.');
  await ctx.dataSource.getRepository(RunEntity).delete({ id: row.id });
  for (const key of [row.rawKey, row.dataKey])
    await ctx.storage.delete(key).catch((err) => ctx.logger.error({ err, key }, 'could not remove a deleted run object'));
}

/** The stored columns of a run. */
export async function loadColumns(ctx: AppContext, row: RunEntity) {
  const bytes = await ctx.storage.get(row.dataKey);
  if (!bytes) throw new Error(`stored columns missing for run ${row.id}`);
  return decodeColumnar(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength));
}

/** Min and max per time bucket for the chart; never used for a figure. */
export async function runSeries(ctx: AppContext, row: RunEntity, points: number) {
  const cols = await loadColumns(ctx, row);
  return { ...bucketMinMax(cols.time, cols.channels, points), points, sampleCount: cols.time.length };
}

/** The traces tried for cross-correlation, in order: the first both runs carry is used. */
const ALIGN_CHANNELS = ['throttle_pct', 'motor_rpm'] as const;

/**
 * The offset (s) that lines run b up on run a, and how it was found: by cross-correlating the throttle (or, when
 * a run has no throttle, the motor speed) traces when both runs carry one and they match well enough; else
 * by their first sustained full throttle; else 0 (their starts). The full-throttle marks are always reported.
 */
export async function alignRuns(ctx: AppContext, a: RunEntity, b: RunEntity): Promise<RunCompare['alignment']> {
  const [ca, cb] = [await loadColumns(ctx, a), await loadColumns(ctx, b)];
  const aAtS = firstSustainedFullThrottle(ca.time, ca.channels.throttle_pct);
  const bAtS = firstSustainedFullThrottle(cb.time, cb.channels.throttle_pct);
  const channel = ALIGN_CHANNELS.find((c) => ca.channels[c] && cb.channels[c]);
  const found = channel ? crossCorrelationOffset({ time: ca.time, values: ca.channels[channel]! }, { time: cb.time, values: cb.channels[channel]! }) : null;
  if (channel && found)
    return {
      offsetS: Math.round(found.offsetS * 1000) / 1000,
      method: 'cross-correlation',
      channel,
      correlation: Math.round(found.correlation * 1000) / 1000,
      aAtS,
      bAtS,
    };
  if (aAtS !== null && bAtS !== null) return { offsetS: bAtS - aAtS, method: 'full-throttle', channel: 'throttle_pct', correlation: null, aAtS, bAtS };
  return { offsetS: 0, method: 'start', channel: null, correlation: null, aAtS, bAtS };
}

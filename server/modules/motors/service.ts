import type { DataSource, EntityManager } from 'typeorm';
import type { CheckCreate, MotorCreate, MotorPatch } from '../../../shared/schemas/motor';
import { BENCH_READINGS, type BenchReading } from '../../../shared/motors/quantities';
import { AppError, notFound, validationFailed } from '../../lib/errors';
import { BenchCheckEntity } from './bench-check.entity';
import { MotorEntity } from './motor.entity';
import { canSeeMotor } from './policy';

type Db = DataSource | EntityManager;
export type MotorStats = { checkCount: number; lastTestedAt: Date | null };

/** The caller's motors, newest first, with how many checks each has and when it was last tested. */
export async function listMotors(db: Db, ownerId: string): Promise<Array<{ row: MotorEntity; stats: MotorStats }>> {
  const rows = await db.getRepository(MotorEntity).find({ where: { ownerId }, order: { createdAt: 'DESC' } });
  const stats = await statsFor(
    db,
    rows.map((r) => r.id),
  );
  return rows.map((row) => ({ row, stats: stats.get(row.id) ?? { checkCount: 0, lastTestedAt: null } }));
}

async function statsFor(db: Db, ids: string[]): Promise<Map<string, MotorStats>> {
  if (!ids.length) return new Map();
  const rows: { motor_id: string; n: string; last: Date | null }[] = await db.query(
    `SELECT motor_id, count(*) AS n, max(tested_at) AS last FROM bench_checks WHERE motor_id = ANY($1::uuid[]) GROUP BY motor_id`,
    [ids],
  );
  return new Map(rows.map((r) => [r.motor_id, { checkCount: Number(r.n), lastTestedAt: r.last ? new Date(r.last) : null }]));
}

/** One motor with its stats. */
export async function motorWithStats(db: Db, row: MotorEntity) {
  return { row, stats: (await statsFor(db, [row.id])).get(row.id) ?? { checkCount: 0, lastTestedAt: null } };
}

/** The caller's motor, or 404 worded exactly as for an id that was never used. */
export async function getMotor(db: Db, user: { id: string } | null, id: string): Promise<MotorEntity> {
  const row = await db.getRepository(MotorEntity).findOneBy({ id });
  if (!row || !canSeeMotor(user, row)) throw notFound('That motor');
  return row;
}

/** True when the motor exists and belongs to this member (setup records may name one of their own). */
export async function ownsMotor(db: Db, ownerId: string, motorId: string): Promise<boolean> {
  return db.getRepository(MotorEntity).existsBy({ id: motorId, ownerId });
}

export async function createMotor(db: Db, ownerId: string, body: MotorCreate): Promise<MotorEntity> {
  const repo = db.getRepository(MotorEntity);
  return repo.save(
    repo.create({
      ownerId,
      label: body.label,
      kvRpmPerV: body.kvRpmPerV ?? null,
      windTurns: body.windTurns ?? null,
      poles: body.poles,
      sensored: body.sensored,
      rotorNotes: body.rotorNotes ?? '',
      tolerances: {},
    }),
  );
}

/** Changes a motor; a reference check must be one of this motor's checks. Locked so two edits do not interleave. */
export async function updateMotor(ds: DataSource, user: { id: string }, id: string, patch: MotorPatch): Promise<MotorEntity> {
  return ds.transaction(async (m) => {
    await getMotor(m, user, id);
    const row = await m.getRepository(MotorEntity).findOneOrFail({ where: { id }, lock: { mode: 'pessimistic_write' } });
    if (patch.referenceCheckId) {
      const owned = await m.getRepository(BenchCheckEntity).existsBy({ id: patch.referenceCheckId, motorId: id });
      if (!owned) throw validationFailed([{ path: 'body.referenceCheckId', message: 'The reference must be one of this motor’s checks' }]);
    }
    const { tolerances, ...rest } = patch;
    for (const [k, v] of Object.entries(rest)) if (v !== undefined) (row as unknown as Record<string, unknown>)[k] = k === 'rotorNotes' ? (v ?? '') : v;
    // Tolerances merge: a member sets one quantity at a time; sending the default back is how to reset one.
    if (tolerances) row.tolerances = { ...row.tolerances, ...tolerances };
    return m.getRepository(MotorEntity).save(row);
  });
}

export async function deleteMotor(ds: DataSource, user: { id: string }, id: string): Promise<void> {
  const row = await getMotor(ds, user, id);
  await ds.getRepository(MotorEntity).delete({ id: row.id });
}

/** Puts single values and repeat lists into one shape: every reading as its list of repeats. */
export function normaliseReadings(body: CheckCreate): Partial<Record<BenchReading, number[]>> {
  const out: Partial<Record<BenchReading, number[]>> = {};
  for (const q of BENCH_READINGS) {
    const list = body.readings?.[q] ?? (body[q] !== undefined ? [body[q] as number] : undefined);
    if (list) out[q] = list;
  }
  return out;
}

export async function addCheck(db: Db, user: { id: string }, motorId: string, body: CheckCreate): Promise<BenchCheckEntity> {
  const motor = await getMotor(db, user, motorId);
  const repo = db.getRepository(BenchCheckEntity);
  return repo.save(
    repo.create({
      motorId: motor.id,
      testedAt: body.testedAt ? new Date(body.testedAt) : new Date(),
      readings: normaliseReadings(body),
      resistanceTempC: body.resistanceTempC ?? null,
      notes: body.notes ?? '',
    }),
  );
}

/** A motor's checks, oldest first (the order of its history). */
export async function listChecks(db: Db, motorId: string): Promise<BenchCheckEntity[]> {
  return db.getRepository(BenchCheckEntity).find({ where: { motorId }, order: { testedAt: 'ASC', createdAt: 'ASC' } });
}

/** The check comparisons start from: the one the member marked, else the first. */
export function referenceOf(motor: MotorEntity, checks: BenchCheckEntity[]): BenchCheckEntity | undefined {
  return checks.find((c) => c.id === motor.referenceCheckId) ?? checks[0];
}

/** The two checks of a comparison: `from` defaults to the reference, `to` to the latest check. */
export async function comparePair(db: Db, user: { id: string }, motorId: string, fromId?: string, toId?: string) {
  const motor = await getMotor(db, user, motorId);
  const checks = await listChecks(db, motor.id);
  if (!checks.length) throw new AppError(409, 'no_checks', 'This motor has no bench checks yet; add one first.');
  const pick = (id: string | undefined, fallback: BenchCheckEntity) => {
    if (!id) return fallback;
    const found = checks.find((c) => c.id === id);
    if (!found) throw notFound('That check');
    return found;
  };
  return { motor, checks, from: pick(fromId, referenceOf(motor, checks)!), to: pick(toId, checks[checks.length - 1]) };
}

export async function deleteCheck(db: Db, user: { id: string }, motorId: string, checkId: string): Promise<void> {
  const motor = await getMotor(db, user, motorId);
  const res = await db.getRepository(BenchCheckEntity).delete({ id: checkId, motorId: motor.id });
  if (!res.affected) throw notFound('That check');
}

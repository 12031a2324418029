import type { Check, Motor } from '../../../shared/schemas/motor';
import { checkValues } from '../../../shared/motors/check-values';
import { BENCH_READINGS } from '../../../shared/motors/quantities';
import type { BenchCheckEntity } from './bench-check.entity';
import type { MotorEntity } from './motor.entity';
import type { MotorStats } from './service';

export function presentMotor({ row, stats }: { row: MotorEntity; stats: MotorStats }): Motor {
  return {
    id: row.id,
    label: row.label,
    kvRpmPerV: row.kvRpmPerV,
    windTurns: row.windTurns,
    poles: row.poles,
    sensored: row.sensored,
    rotorNotes: row.rotorNotes,
    tolerances: row.tolerances,
    referenceCheckId: row.referenceCheckId,
    checkCount: stats.checkCount,
    lastTestedAt: stats.lastTestedAt?.toISOString() ?? null,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** A check with each reading's mean in its scalar field, the repeats with their spread, and the computed values. */
export function presentCheck(row: BenchCheckEntity, referenceId: string | undefined): Check {
  const v = checkValues({ readings: row.readings, resistanceTempC: row.resistanceTempC });
  const scalars = Object.fromEntries(BENCH_READINGS.map((q) => [q, v.readings[q]?.mean ?? null]));
  return {
    id: row.id,
    motorId: row.motorId,
    testedAt: row.testedAt.toISOString(),
    ...scalars,
    resistanceTempC: row.resistanceTempC,
    notes: row.notes,
    readings: v.readings,
    computed: {
      measuredKv: v.measuredKv,
      measuredKvSpread: v.measuredKvSpread,
      resistanceAt20COhm: v.resistanceAt20COhm,
      resistanceAt20CSpread: v.resistanceAt20CSpread,
    },
    isReference: row.id === referenceId,
    createdAt: row.createdAt.toISOString(),
  } as Check;
}

import type { DataSource } from 'typeorm';
import type { UserEntity } from '../auth/user.entity';
import { BenchCheckEntity } from './bench-check.entity';
import { MotorEntity } from './motor.entity';

const DAY = 86_400_000;
const LABEL = 'Harbour Flats stock can (blue)';

/**
 * A demo motor for Rosa with a season of invented bench checks: steady readings, then a rebuild where the
 * endbell went back a few degrees off, then put right. Enough checks for the history's control limits.
 * Skipped when she already has a motor of that label.
 */
export async function seedDemoMotor(ds: DataSource, owner: UserEntity | undefined): Promise<number> {
  if (!owner) return 0;
  return ds.transaction(async (m) => {
    if (await m.getRepository(MotorEntity).existsBy({ ownerId: owner.id, label: LABEL })) return 0;
    const motor = await m.getRepository(MotorEntity).save(
      m.getRepository(MotorEntity).create({
        ownerId: owner.id,
        label: LABEL,
        kvRpmPerV: null,
        windTurns: 17.5,
        poles: 2,
        sensored: true,
        rotorNotes: '12.5 mm stock rotor, one 0.1 mm shim at the endbell',
        tolerances: {},
      }),
    );
    const rows: Array<[rpm: number[], amps: number, timing: number, ohm: number, tempC: number, notes: string]> = [
      [[17_010, 17_030, 17_020], 2.1, 30, 0.0215, 21, 'New motor, first check'],
      [[17_040], 2.12, 30, 0.0216, 23, ''],
      [[16_990], 2.08, 30, 0.0214, 19, ''],
      [[17_020], 2.15, 30.5, 0.0215, 21, 'Before teardown: bearings feel rough'],
      [[17_860, 17_900, 17_880], 1.95, 37.5, 0.0216, 22, 'After rebuild, new bearings'],
      [[17_030], 1.98, 30, 0.0215, 22, 'Endbell set back to the marks'],
      [[17_000], 2.0, 30, 0.0216, 24, ''],
      [[17_050], 2.02, 30, 0.0215, 20, 'Club night'],
      [[17_010, 17_040], 2.01, 30, 0.0215, 21, ''],
    ];
    const start = Date.now() - rows.length * 14 * DAY;
    for (const [i, [rpm, amps, timing, ohm, tempC, notes]] of rows.entries()) {
      await m.getRepository(BenchCheckEntity).save(
        m.getRepository(BenchCheckEntity).create({
          motorId: motor.id,
          testedAt: new Date(start + i * 14 * DAY),
          readings: {
            testVoltageV: [7.4],
            noLoadRpm: rpm,
            noLoadCurrentA: [amps],
            timingDeg: [timing],
            rotorSymmetryPct: [0.6],
            sensorDeviationPct: [1.1],
            phaseResistanceOhm: [ohm],
          },
          resistanceTempC: tempC,
          notes,
        }),
      );
    }
    return rows.length;
  });
}

import type { MigrationInterface, QueryRunner } from 'typeorm';

/** A run may name one of its owner's registered motors; cleared if that motor is deleted. */
export class RunMotor1796600000014 implements MigrationInterface {
  name = 'RunMotor1796600000014';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE runs ADD COLUMN motor_id uuid REFERENCES motors(id) ON DELETE SET NULL`);
    await q.query(`CREATE INDEX runs_motor_idx ON runs (motor_id) WHERE motor_id IS NOT NULL`);
    await q.query(`CREATE INDEX runs_setup_idx ON runs (setup_id) WHERE setup_id IS NOT NULL`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX IF EXISTS runs_setup_idx`);
    await q.query(`DROP INDEX IF EXISTS runs_motor_idx`);
    await q.query(`ALTER TABLE runs DROP COLUMN IF EXISTS motor_id`);
  }
}

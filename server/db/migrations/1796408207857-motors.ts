import type { MigrationInterface, QueryRunner } from 'typeorm';

/** A member's motor register and its bench checks (issue #15). Checks go with their motor. */
export class Motors1796408207857 implements MigrationInterface {
  name = 'Motors1796408207857';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE motors (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        owner_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        label text NOT NULL CHECK (length(label) BETWEEN 1 AND 80),
        kv_rpm_per_v double precision CHECK (kv_rpm_per_v > 0),
        wind_turns double precision CHECK (wind_turns > 0),
        poles integer NOT NULL CHECK (poles >= 2 AND poles % 2 = 0),
        sensored boolean NOT NULL,
        rotor_notes text NOT NULL DEFAULT '',
        tolerances jsonb NOT NULL DEFAULT '{}'::jsonb,
        reference_check_id uuid,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX motors_owner_idx ON motors (owner_id, created_at)`);
    await q.query(`
      CREATE TABLE bench_checks (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        motor_id uuid NOT NULL REFERENCES motors(id) ON DELETE CASCADE,
        tested_at timestamptz NOT NULL,
        readings jsonb NOT NULL,
        resistance_temp_c double precision CHECK (resistance_temp_c BETWEEN -40 AND 200),
        notes text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX bench_checks_motor_idx ON bench_checks (motor_id, tested_at, created_at)`);
    // A marked reference must be one of the motor's own checks; deleting it falls back to the first check.
    await q.query(`ALTER TABLE motors ADD CONSTRAINT motors_reference_fk FOREIGN KEY (reference_check_id) REFERENCES bench_checks(id) ON DELETE SET NULL`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE motors DROP CONSTRAINT IF EXISTS motors_reference_fk`);
    await q.query(`DROP TABLE IF EXISTS bench_checks`);
    await q.query(`DROP TABLE IF EXISTS motors`);
  }
}

import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Display units per account (#17): how figures are shown to this person; stored values stay SI. */
export class UserUnits1797300000001 implements MigrationInterface {
  name = 'UserUnits1797300000001';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE users ADD COLUMN units text NOT NULL DEFAULT 'metric' CHECK (units IN ('metric', 'imperial'))`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE users DROP COLUMN units`);
  }
}

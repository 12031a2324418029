import 'reflect-metadata';
import pg from 'pg';
import { createDataSource } from '../../server/db/data-source';

export const TEMPLATE_DB = 'tw_template';

/** Builds the migrated template database once; every test file clones it (CREATE DATABASE … TEMPLATE). */
export default async function setup() {
  const adminUrl = process.env.TEST_PG_ADMIN_URL;
  if (!adminUrl) return; // pure unit runs (npx vitest run tests/shared) need no database
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`DROP DATABASE IF EXISTS ${TEMPLATE_DB}`);
  await admin.query(`CREATE DATABASE ${TEMPLATE_DB}`);
  await admin.end();
  const ds = createDataSource(adminUrl.replace(/\/[^/]*$/, `/${TEMPLATE_DB}`), { poolMax: 1 });
  await ds.initialize();
  await ds.runMigrations({ transaction: 'each' });
  await ds.destroy();
}

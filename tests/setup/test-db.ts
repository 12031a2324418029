import 'reflect-metadata';
import crypto from 'node:crypto';
import pg from 'pg';
import type { DataSource } from 'typeorm';
import { createDataSource } from '../../server/db/data-source';

const TEMPLATE_DB = 'tw_template';

export function adminUrl() {
  const url = process.env.TEST_PG_ADMIN_URL;
  if (!url) throw new Error('TEST_PG_ADMIN_URL is not set: run the suite with `npm test`, which starts a throwaway PostgreSQL.');
  return url;
}

export const urlForDb = (name: string) => adminUrl().replace(/\/[^/]*$/, `/${name}`);

async function adminQuery(sql: string) {
  const c = new pg.Client({ connectionString: adminUrl() });
  await c.connect();
  try {
    await c.query(sql);
  } finally {
    await c.end();
  }
}

export type TestDatabase = { name: string; url: string; dataSource: DataSource; drop: () => Promise<void> };

/** A fresh, migrated database for one test file, cloned from the template. */
export async function createTestDatabase(): Promise<TestDatabase> {
  const name = `tw_${crypto.randomBytes(6).toString('hex')}`;
  // CREATE DATABASE … TEMPLATE fails if another session is connected to the template; retry briefly.
  for (let attempt = 0; ; attempt++) {
    try {
      await adminQuery(`CREATE DATABASE ${name} TEMPLATE ${TEMPLATE_DB}`);
      break;
    } catch (err) {
      if (attempt > 20) throw err;
      await new Promise((r) => setTimeout(r, 100));
    }
  }
  const url = urlForDb(name);
  const dataSource = createDataSource(url, { poolMax: 5 });
  await dataSource.initialize();
  return {
    name,
    url,
    dataSource,
    drop: async () => {
      if (dataSource.isInitialized) await dataSource.destroy();
      await adminQuery(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    },
  };
}

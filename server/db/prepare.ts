// Runs migrations and the idempotent seed; used by `npm start` before the app starts.
import 'reflect-metadata';
import { loadConfig } from '../config/env';
import { createDataSource } from './data-source';
import { seed } from './seed';
import { createStorage } from '../lib/storage';
import { createLogger } from '../lib/logger';

const config = loadConfig();
const ds = createDataSource(config.databaseUrl, { poolMax: 2, applicationName: 'tunewright-prepare' });
await ds.initialize();
const ran = await ds.runMigrations({ transaction: 'each' });
if (ran.length) console.log(`[tunewright] applied ${ran.length} migration(s): ${ran.map((m) => m.name).join(', ')}`);
if (process.argv.includes('--migrate-only')) {
  await ds.destroy();
  process.exit(0);
}
await seed(ds, {
  demo: process.env.SEED_DEMO !== 'false',
  bcryptCost: config.bcryptCost,
  log: (m) => console.log(`[tunewright] ${m}`),
  runs: { storage: createStorage(config.storage), logger: createLogger(config.logLevel) },
});
await ds.destroy();

// `npm run db:reset`: drops everything in the app's database, migrates and seeds again (local demo data only).
import 'reflect-metadata';
import fs from 'node:fs';
import path from 'node:path';
import { createDataSource } from './data-source';
import { seed } from './seed';

const runtime = path.resolve('.data', 'runtime.json');
const url = process.env.DATABASE_URL ?? (fs.existsSync(runtime) ? JSON.parse(fs.readFileSync(runtime, 'utf8')).DATABASE_URL : undefined);
if (!url) {
  console.error('No database: set DATABASE_URL, or start the demo once with `npm start`.');
  process.exit(2);
}
if (process.env.NODE_ENV === 'production' && process.env.CONFIRM_RESET !== 'yes') {
  console.error('Refusing to reset a production database without CONFIRM_RESET=yes.');
  process.exit(2);
}
const ds = createDataSource(url, { poolMax: 1 });
await ds.initialize();
await ds.query('DROP SCHEMA public CASCADE; CREATE SCHEMA public;');
await ds.runMigrations({ transaction: 'each' });
await seed(ds, { demo: process.env.NODE_ENV !== 'production', bcryptCost: Number(process.env.BCRYPT_COST ?? 12), log: (m) => console.log(`[db:reset] ${m}`) });
await ds.destroy();
console.log('[db:reset] done');

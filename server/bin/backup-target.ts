// Where the CLI tools find the database and the uploads: the environment, else what `npm start` recorded.
import fs from 'node:fs';
import path from 'node:path';
import { findPgBin } from './postgres.mjs';

/** DATABASE_URL from the environment or .data/runtime.json; exits with a clear message when neither has it. */
export function databaseUrlOrExit(): string {
  const runtime = path.resolve('.data', 'runtime.json');
  const url =
    process.env.DATABASE_URL ?? (fs.existsSync(runtime) ? (JSON.parse(fs.readFileSync(runtime, 'utf8')).DATABASE_URL as string | undefined) : undefined);
  if (!url) {
    console.error('No database: set DATABASE_URL, or run `npm start` first (it records the local database in .data/runtime.json).');
    process.exit(2);
  }
  return url;
}

/** The uploads folder the app uses (UPLOAD_DIR, default .data/uploads). */
export const uploadDir = () => path.resolve(process.env.UPLOAD_DIR ?? path.join('.data', 'uploads'));

/** PostgreSQL's client tools (pg_dump, pg_restore), newest installed version. */
export function pgBinOrExit(): string {
  const bin = findPgBin();
  if (!bin) {
    console.error('pg_dump/pg_restore not found: install the postgresql package (npm start does this on first run).');
    process.exit(2);
  }
  return bin;
}

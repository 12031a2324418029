// `npm run db:backup [-- --out <folder>]`: pg_dump of the app's database and a tar of the uploads folder
// into <folder>/<timestamp>/ (default .data/backups). The app may keep running.
import path from 'node:path';
import { parseArgs } from 'node:util';
import { createBackup } from '../lib/backup';
import { databaseUrlOrExit, pgBinOrExit, uploadDir } from './backup-target';

const { values } = parseArgs({ options: { out: { type: 'string', default: path.join('.data', 'backups') } } });
try {
  const { dir, manifest } = await createBackup({
    databaseUrl: databaseUrlOrExit(),
    uploadDir: uploadDir(),
    outRoot: path.resolve(values.out!),
    pgBin: pgBinOrExit(),
  });
  const rows = Object.values(manifest.tables).reduce((a, b) => a + b, 0);
  console.log(`Backup written to ${dir}`);
  console.log(
    `  database "${manifest.database}": ${Object.keys(manifest.tables).length} tables, ${rows} rows (${['documents', 'revisions', 'users'].map((t) => `${t} ${manifest.tables[t] ?? 0}`).join(', ')})`,
  );
  console.log(`  uploads: ${manifest.uploads.length} files`);
} catch (err) {
  console.error(`Backup failed: ${(err as Error).message}`);
  process.exit(1);
}

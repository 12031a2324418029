// `npm run db:restore [-- <backup folder>] [--database-url <url>] [--uploads <folder>] [--replace]`
// Restores a backup (default: the newest under .data/backups) into a fresh or empty database and an
// empty uploads folder, then checks every table's row count and every file's hash against the backup.
// --replace drops and recreates the target database and empties the uploads folder first: stop the app before.
import path from 'node:path';
import { parseArgs } from 'node:util';
import { latestBackup, restoreBackup } from '../lib/backup';
import { databaseUrlOrExit, pgBinOrExit, uploadDir } from './backup-target';

const { values, positionals } = parseArgs({
  allowPositionals: true,
  options: {
    'database-url': { type: 'string' },
    uploads: { type: 'string' },
    replace: { type: 'boolean', default: false },
    from: { type: 'string', default: path.join('.data', 'backups') },
  },
});
const backupDir = positionals[0] ? path.resolve(positionals[0]) : latestBackup(path.resolve(values.from!));
if (!backupDir) {
  console.error(`No backup found under ${values.from}: run \`npm run db:backup\` first or name a backup folder.`);
  process.exit(2);
}
const databaseUrl = values['database-url'] ?? databaseUrlOrExit();
try {
  const { counts, manifest } = await restoreBackup({
    backupDir,
    databaseUrl,
    uploadDir: values.uploads ? path.resolve(values.uploads) : uploadDir(),
    pgBin: pgBinOrExit(),
    replace: values.replace,
  });
  console.log(`Restored ${backupDir} (taken ${manifest.createdAt}) into "${new URL(databaseUrl).pathname.slice(1)}"`);
  console.log(`  ${Object.keys(counts).length} tables, row counts match the backup; ${manifest.uploads.length} upload files match their hashes`);
} catch (err) {
  console.error(`Restore failed: ${(err as Error).message}`);
  process.exit(1);
}

import fs from 'node:fs';
import path from 'node:path';

/** The package version, read once at start. */
export const APP_VERSION: string = (() => {
  try {
    return JSON.parse(fs.readFileSync(path.resolve(process.cwd(), 'package.json'), 'utf8')).version ?? '0.0.0';
  } catch {
    return '0.0.0';
  }
})();

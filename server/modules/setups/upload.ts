import type { NextFunction, Request, Response } from 'express';
import multer from 'multer';
import { LIMITS } from '../../../shared/constants';
import type { SetupIssue } from '../../../shared/setup/import';
import { AppError } from '../../lib/errors';

/** Every refused setup upload uses this code, with one detail per problem. */
export const INVALID_SETUP = 'invalid_setup';

export const invalidSetup = (status: 400 | 413 | 415, message: string, details: SetupIssue[]) => new AppError(status, INVALID_SETUP, message, details);

const parser = multer({
  storage: multer.memoryStorage(),
  // Keep the name exactly as sent (with any path) so a path in it can be refused rather than silently cut off.
  preservePath: true,
  defParamCharset: 'utf8',
  limits: { fileSize: LIMITS.uploadBytes, files: 1, fields: 4, parts: 5, fieldNameSize: 100, headerPairs: 50 },
}).single('file');

/** multer with its failures turned into invalid_setup errors (413 for the size limit). */
export function parseSetupUpload(req: Request, res: Response, next: NextFunction) {
  parser(req, res, (err?: unknown) => {
    if (!err) return next();
    const e = err as { code?: string; field?: string; message?: string };
    if (e.code === 'LIMIT_FILE_SIZE')
      return next(invalidSetup(413, 'That file is too large.', [{ path: 'file', message: `Setup files are at most ${LIMITS.uploadBytes / 1024} KB` }]));
    if (e.code === 'LIMIT_UNEXPECTED_FILE')
      return next(invalidSetup(400, 'Send one file in the "file" field.', [{ path: e.field ?? 'file', message: 'Send one file, in the field named "file"' }]));
    if (e.code?.startsWith('LIMIT_'))
      return next(invalidSetup(400, 'The upload was refused.', [{ path: e.field ?? 'file', message: e.message ?? 'Too many parts in the upload' }]));
    if (/header/i.test(e.message ?? ''))
      return next(
        invalidSetup(400, 'The upload could not be read.', [
          { path: 'file', message: 'A part header (such as the file name) holds characters that are not allowed; rename the file and try again' },
        ]),
      );
    return next(invalidSetup(400, 'The upload could not be read.', [{ path: 'file', message: 'The multipart body is malformed or was cut off; try again' }]));
  });
}

// Declared types a browser or tool may send for each kind of file; anything else is refused.
const ACCEPTED_TYPES: Record<'json' | 'csv', string[]> = {
  json: ['application/json', 'text/json', 'text/plain', 'application/octet-stream', ''],
  csv: ['text/csv', 'application/csv', 'text/comma-separated-values', 'text/plain', 'application/vnd.ms-excel', 'application/octet-stream', ''],
};

// Control characters, bidirectional overrides, zero-width characters, the BOM and the replacement
// character (what undecodable bytes become): none belongs in a file name a person typed.
// eslint-disable-next-line no-control-regex -- matching control characters is the point here
const ODD_CHARACTERS = /[\u0000-\u001f\u007f-\u009f\u200b-\u200f\u202a-\u202e\u2060-\u2069\ufeff\ufffd]/u;

/** Checks the uploaded file's name; returns its kind and a display-safe version, or the reason it is refused. */
export function checkFileName(raw: string): { kind: 'json' | 'csv'; displayName: string } | { status: 400 | 415; issue: SetupIssue } {
  if (/[/\\]/.test(raw) || raw.includes('..')) {
    return { status: 400, issue: { path: 'file.name', message: 'The file name must not contain a folder path (/, \\ or ..); rename the file and try again' } };
  }
  if (ODD_CHARACTERS.test(raw)) {
    return {
      status: 400,
      issue: { path: 'file.name', message: 'The file name contains control, invisible or undecodable characters; rename the file and try again' },
    };
  }
  const name = raw.normalize('NFC').trim();
  if (name.length === 0 || name.length > 120) return { status: 400, issue: { path: 'file.name', message: 'The file name must be 1 to 120 characters long' } };
  const match = /\.(json|csv)$/i.exec(name);
  if (!match) return { status: 415, issue: { path: 'file.name', message: 'Only .json (our setup record) or .csv (our CSV layout) files are accepted' } };
  const kind = match[1].toLowerCase() as 'json' | 'csv';
  // What is left is shown on screen and used as a download name: letters, digits and a few safe marks only.
  const stem =
    name
      .slice(0, -match[0].length)
      .replace(/[^\p{L}\p{N} ._()+-]/gu, '_')
      .replace(/\s+/g, ' ')
      .replace(/^[.\s]+/, '')
      .trim() || 'setup';
  return { kind, displayName: `${stem}.${kind}` };
}

/** Checks the declared type and the bytes; returns the text, or the reason the file is refused. */
export function checkFileContent(
  file: { mimetype: string; buffer: Buffer },
  kind: 'json' | 'csv',
): { text: string } | { status: 400 | 415; issue: SetupIssue } {
  const declared = (file.mimetype ?? '').split(';')[0].trim().toLowerCase();
  if (!ACCEPTED_TYPES[kind].includes(declared)) {
    return {
      status: 415,
      issue: { path: 'file.type', message: `A .${kind} file was sent as ${declared}; send it as ${kind === 'json' ? 'application/json' : 'text/csv'}` },
    };
  }
  if (file.buffer.length === 0) return { status: 400, issue: { path: 'file', message: 'The file is empty' } };
  if (file.buffer.includes(0)) return { status: 415, issue: { path: 'file', message: 'This is a binary file, not a text setup record' } };
  try {
    return { text: new TextDecoder('utf-8', { fatal: true }).decode(file.buffer) };
  } catch {
    return { status: 415, issue: { path: 'file', message: 'The file is not UTF-8 text; save it as UTF-8 and try again' } };
  }
}

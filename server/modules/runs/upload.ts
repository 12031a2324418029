import type { NextFunction, Request, Response } from 'express';
import multer from 'multer';
import type { RunlogProblem } from '../../../shared/runlog/table';
import { RUNLOG_LIMITS } from '../../../shared/runlog/vocabulary';
import { AppError } from '../../lib/errors';
import { checkFileName } from '../setups/upload';

/** Every refused run-log upload uses this code; details name the row and column of the first problem. */
export const INVALID_RUN_LOG = 'invalid_run_log';

export type RunIssue = { path: string; message: string; row?: number; column?: string };

export const invalidRunLog = (status: 400 | 413 | 415, message: string, details: RunIssue[]) => new AppError(status, INVALID_RUN_LOG, message, details);

/** The problem a parser found, as the error the client gets: where it is, then what. */
export function problemError(status: 400 | 413, problem: RunlogProblem) {
  const where = [problem.row !== undefined ? `row ${problem.row}` : null, problem.column !== undefined ? `column "${problem.column}"` : null]
    .filter(Boolean)
    .join(', ');
  return invalidRunLog(status, where ? `The run log has a problem at ${where}: ${problem.message}` : problem.message, [
    {
      path: 'file',
      message: problem.message,
      ...(problem.row !== undefined ? { row: problem.row } : {}),
      ...(problem.column !== undefined ? { column: problem.column } : {}),
    },
  ]);
}

const parser = multer({
  storage: multer.memoryStorage(),
  preservePath: true,
  defParamCharset: 'utf8',
  limits: { fileSize: RUNLOG_LIMITS.fileBytes, files: 1, fields: 4, parts: 5, fieldNameSize: 100, fieldSize: 64 * 1024, headerPairs: 50 },
}).single('file');

/** multer with its failures turned into invalid_run_log errors (413 past the size limit). */
export function parseRunUpload(req: Request, res: Response, next: NextFunction) {
  parser(req, res, (err?: unknown) => {
    if (!err) return next();
    const e = err as { code?: string; field?: string; message?: string };
    if (e.code === 'LIMIT_FILE_SIZE')
      return next(
        invalidRunLog(413, 'That file is too large.', [
          { path: 'file', message: `Run logs are at most ${RUNLOG_LIMITS.fileBytes / 1024 / 1024} MB; split a long session into runs` },
        ]),
      );
    if (e.code === 'LIMIT_UNEXPECTED_FILE')
      return next(invalidRunLog(400, 'Send one file in the "file" field.', [{ path: e.field ?? 'file', message: 'Send one file, in the field named "file"' }]));
    if (e.code?.startsWith('LIMIT_'))
      return next(invalidRunLog(400, 'The upload was refused.', [{ path: e.field ?? 'file', message: e.message ?? 'Too many parts in the upload' }]));
    return next(invalidRunLog(400, 'The upload could not be read.', [{ path: 'file', message: 'The multipart body is malformed or was cut off; try again' }]));
  });
}

const ACCEPTED_TYPES = ['text/csv', 'application/csv', 'text/comma-separated-values', 'text/plain', 'application/vnd.ms-excel', 'application/octet-stream', ''];

/** Name, declared type and bytes of an uploaded run log; returns its display name and text, or throws the refusal. */
export function readRunFile(file: Express.Multer.File | undefined): { displayName: string; text: string; legacyEncoding: boolean } {
  if (!file) throw invalidRunLog(400, 'Attach a run log.', [{ path: 'file', message: 'Send the run log (a .csv file) in the multipart field "file"' }]);
  const name = checkFileName(file.originalname ?? '');
  if ('issue' in name) throw invalidRunLog(name.status, 'That file name is refused.', [name.issue]);
  if (name.kind !== 'csv') throw invalidRunLog(415, 'Run logs are CSV files.', [{ path: 'file.name', message: 'Send the run log as a .csv file' }]);
  const declared = (file.mimetype ?? '').split(';')[0].trim().toLowerCase();
  if (!ACCEPTED_TYPES.includes(declared))
    throw invalidRunLog(415, 'Run logs are CSV files.', [{ path: 'file.type', message: `A .csv file was sent as ${declared}; send it as text/csv` }]);
  if (file.buffer.length === 0) throw problemError(400, { code: 'empty', message: 'The file is empty.', row: 1 });
  if (file.buffer.subarray(0, 65536).includes(0))
    throw problemError(400, { code: 'not_a_run_log', message: 'The file holds binary data (NUL bytes); export the log as CSV text.', row: 1 });
  try {
    return { displayName: name.displayName, text: new TextDecoder('utf-8', { fatal: true, ignoreBOM: true }).decode(file.buffer), legacyEncoding: false };
  } catch {
    // Keep the byte-order mark (ignoreBOM) so the parser can say it removed it. Spreadsheets on some systems still save CSV in Windows-1252 (°F as byte B0); read it as that and say so.
    return { displayName: name.displayName, text: new TextDecoder('windows-1252').decode(file.buffer), legacyEncoding: true };
  }
}

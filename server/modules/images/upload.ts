import type { NextFunction, Request, Response } from 'express';
import multer from 'multer';
import { IMAGE_LIMITS } from '../../../shared/markdown/images';
import { invalidImage } from './process';

const parser = multer({
  storage: multer.memoryStorage(),
  defParamCharset: 'utf8',
  // One byte over the limit is enough to know it is too large; multer stops reading there.
  limits: { fileSize: IMAGE_LIMITS.fileBytes, files: 1, fields: 0, parts: 1, fieldNameSize: 100, headerPairs: 50 },
}).single('file');

/** multer with its failures turned into invalid_image errors (413 past the size limit). */
export function parseImageUpload(req: Request, res: Response, next: NextFunction) {
  parser(req, res, (err?: unknown) => {
    if (!err) return next();
    const e = err as { code?: string; field?: string; message?: string };
    if (e.code === 'LIMIT_FILE_SIZE')
      return next(invalidImage(413, 'That image is too large.', `Images are at most ${IMAGE_LIMITS.fileBytes / 1024 / 1024} MB`));
    if (e.code?.startsWith('LIMIT_'))
      return next(invalidImage(400, 'Send one image in the "file" field.', 'Send one file, in the multipart field named "file"'));
    return next(invalidImage(400, 'The upload could not be read.', 'The multipart body is malformed or was cut off; try again'));
  });
}

import sharp, { type Metadata } from 'sharp';
import { IMAGE_LIMITS, storedWidths } from '../../../shared/markdown/images';
import { AppError } from '../../lib/errors';

/** Every refused image upload uses this code; `details` say what to do instead. */
export const INVALID_IMAGE = 'invalid_image';

export const invalidImage = (status: 400 | 413 | 415, message: string, hint: string) =>
  new AppError(status, INVALID_IMAGE, message, [{ path: 'file', message: hint }]);

export type ProcessedImage = {
  format: 'jpeg' | 'png';
  /** The original's size after orientation was applied. */
  width: number;
  height: number;
  variants: Array<{ width: number; height: number; body: Buffer }>;
};

type Sniffed = 'jpeg' | 'png' | 'webp' | 'heif' | 'svg' | 'unknown';

/** What the first bytes say the file is; the decoder is never shown a file these do not name (SVG and XML above all). */
export function sniffImage(buf: Buffer): Sniffed {
  if (buf.length >= 3 && buf[0] === 0xff && buf[1] === 0xd8 && buf[2] === 0xff) return 'jpeg';
  if (buf.length >= 8 && buf.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'png';
  if (buf.length >= 12 && buf.toString('latin1', 0, 4) === 'RIFF' && buf.toString('latin1', 8, 12) === 'WEBP') return 'webp';
  if (buf.length >= 12 && buf.toString('latin1', 4, 8) === 'ftyp') return 'heif';
  const head = buf
    .subarray(0, 1024)
    .toString('utf8')
    .replace(/^\uFEFF/, '')
    .trimStart()
    .toLowerCase();
  if (head.startsWith('<?xml') || head.startsWith('<svg') || head.includes('<svg')) return 'svg';
  return 'unknown';
}

/**
 * Markup or script inside an image file makes it a polyglot: harmless once re-encoded (the output never
 * carries it), but nothing an honest photo or diagram contains, so it is refused rather than cleaned.
 * Compressed data matching one of these by chance is vanishingly unlikely (7 to 9 exact bytes).
 */
const MARKUP = /<(script|html|body|iframe|svg|object|embed|!doctype|\?php)[\s>/]|javascript:|\bon(error|load)\s*=/i;

export function holdsMarkup(buf: Buffer): boolean {
  return MARKUP.test(buf.toString('latin1'));
}

/**
 * Decodes an upload and re-encodes it at each stored width: orientation applied, converted to sRGB, every
 * metadata block (camera, GPS, comments, profiles) left behind. Photos become JPEG; images with
 * transparency and PNG drawings stay PNG. Throws the refusal the client gets; stores nothing itself.
 */
export async function processImage(buf: Buffer): Promise<ProcessedImage> {
  if (buf.length === 0) throw invalidImage(400, 'The file is empty.', 'Choose a photo or diagram (JPEG, PNG or WebP)');
  if (buf.length > IMAGE_LIMITS.fileBytes) throw invalidImage(413, 'That image is too large.', `Images are at most ${IMAGE_LIMITS.fileBytes / 1024 / 1024} MB`);
  const kind = sniffImage(buf);
  if (kind === 'svg') throw invalidImage(415, 'SVG drawings are not accepted.', 'Export the drawing as PNG and upload that');
  if (kind === 'heif')
    throw invalidImage(415, 'HEIC/HEIF photos are not accepted yet.', 'Set the phone camera to "most compatible" (JPEG), or export the photo as JPEG');
  if (kind === 'unknown') throw invalidImage(415, 'That file is not an image we accept.', 'Upload a JPEG, PNG or WebP image');
  if (holdsMarkup(buf))
    throw invalidImage(400, 'That image file also holds web page markup or script.', 'Export the picture again from a photo or drawing program');

  const options = { limitInputPixels: IMAGE_LIMITS.maxPixels, failOn: 'warning', animated: false } as const;
  let meta: Metadata;
  try {
    // Header only (no pixels are decoded here), so the pixel limit is checked below with a clear answer.
    meta = await sharp(buf, { ...options, limitInputPixels: false }).metadata();
  } catch {
    throw invalidImage(400, 'The image could not be read.', 'The file is damaged or is not really an image; export it again');
  }
  if (!meta.width || !meta.height || meta.format !== kind)
    throw invalidImage(400, 'The image could not be read.', 'The file is damaged or is not really an image; export it again');
  // The header alone tells the pixel count: a decompression bomb is refused before anything is decoded.
  if (meta.width * meta.height > IMAGE_LIMITS.maxPixels)
    throw invalidImage(413, 'That image has too many pixels.', `Images are at most ${IMAGE_LIMITS.maxPixels / 1_000_000} megapixels; scale it down first`);
  // EXIF orientations 5–8 swap the sides.
  const swap = (meta.orientation ?? 1) >= 5;
  const width = swap ? meta.height : meta.width;
  const height = swap ? meta.width : meta.height;
  if (width < IMAGE_LIMITS.minSide || height < IMAGE_LIMITS.minSide)
    throw invalidImage(400, 'That image is too small.', `Images are at least ${IMAGE_LIMITS.minSide} pixels on each side`);
  const format: ProcessedImage['format'] = kind === 'png' || meta.hasAlpha ? 'png' : 'jpeg';

  try {
    // Decode once at the largest stored width (JPEG shrink-on-load makes that cheap), then derive the smaller ones.
    const widths = storedWidths(width);
    const top = widths[widths.length - 1];
    const decoded = await sharp(buf, options)
      .rotate()
      .resize({ width: top, withoutEnlargement: true })
      .toColourspace('srgb')
      .raw()
      .toBuffer({ resolveWithObject: true });
    const raw = { width: decoded.info.width, height: decoded.info.height, channels: decoded.info.channels };
    const variants: ProcessedImage['variants'] = [];
    for (const w of widths) {
      let pipeline = sharp(decoded.data, { raw });
      if (w !== raw.width) pipeline = pipeline.resize({ width: w });
      pipeline = format === 'png' ? pipeline.png({ compressionLevel: 9, palette: false }) : pipeline.jpeg({ quality: 80, mozjpeg: true });
      const out = await pipeline.toBuffer({ resolveWithObject: true });
      variants.push({ width: out.info.width, height: out.info.height, body: out.data });
    }
    return { format, width, height, variants };
  } catch {
    // libvips stops at the first damaged byte (failOn: warning): a cut-off JPEG or a broken PNG chunk ends here.
    throw invalidImage(400, 'The image is damaged or cut off.', 'The file did not decode completely; export or upload it again');
  }
}

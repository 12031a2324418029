/**
 * Images in guides and parameter entries. Every image a page shows is one we processed and serve
 * ourselves under `/api/images/<id>/<width>`; Markdown refers to it as `![alt](/api/images/<id>/<width>#<w>x<h>)`.
 * The fragment carries the original's size so both renderers (server HTML and browser preview) can
 * write `width`/`height` and `srcset` without a look-up; browsers never send a fragment to the server.
 */

/** The widths each image is stored at (never wider than the original); srcset offers them all. */
export const IMAGE_WIDTHS = [480, 960, 1600] as const;
/** The width the Markdown points at (what a browser without srcset loads): the largest stored one up to this. */
export const IMAGE_DEFAULT_WIDTH = 960;
/** What the page lays an image out at: the reading column is at most about 720 CSS pixels wide. */
export const IMAGE_SIZES = '(max-width: 760px) 100vw, 720px';

/** What a page shows where a moderator hid an image. */
export const HIDDEN_IMAGE_NOTICE = 'A moderator has hidden this image.';

/** Limits of an upload, checked on the server (the editor says them before sending). */
export const IMAGE_LIMITS = {
  /** Bytes of the uploaded file. */
  fileBytes: 12 * 1024 * 1024,
  /** Pixels of the decoded image (width × height): a phone's 48-megapixel photo passes, a decompression bomb does not. */
  maxPixels: 50_000_000,
  /** Neither side may be smaller than this. */
  minSide: 16,
  /** Images in one revision. */
  perRevision: 30,
  /** Alt text length. */
  altMax: 300,
} as const;

const UUID = '[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}';
const IMAGE_SRC = new RegExp(`^/api/images/(${UUID})/([1-9][0-9]{1,4})(?:#([1-9][0-9]{0,5})x([1-9][0-9]{0,5}))?$`);
/** Finds every image of ours a Markdown text refers to (for references and checks; ids only). */
export const IMAGE_ID_IN_TEXT = new RegExp(`/api/images/(${UUID})/`, 'g');

export type ImageRef = { id: string; width: number; original: { width: number; height: number } | null };

/** Reads one of our image URLs (with or without the size fragment); anything else is null. */
export function parseImageSrc(src: string | null | undefined): ImageRef | null {
  if (!src) return null;
  const m = IMAGE_SRC.exec(src);
  if (!m) return null;
  const original = m[3] && m[4] ? { width: Number(m[3]), height: Number(m[4]) } : null;
  return { id: m[1], width: Number(m[2]), original };
}

/** The widths stored for an original of this width: the standard ones below it, then the original capped at the largest. */
export function storedWidths(originalWidth: number): number[] {
  const top = Math.min(originalWidth, IMAGE_WIDTHS[IMAGE_WIDTHS.length - 1]);
  return [...IMAGE_WIDTHS.filter((w) => w < top), top];
}

/** The width the Markdown's URL names. */
export const defaultWidth = (originalWidth: number) =>
  storedWidths(originalWidth)
    .filter((w) => w <= IMAGE_DEFAULT_WIDTH)
    .at(-1) ?? storedWidths(originalWidth)[0];

export const imageUrl = (id: string, width: number) => `/api/images/${id}/${width}`;

/** The srcset attribute for an image whose original is this wide. */
export const imageSrcset = (id: string, originalWidth: number) =>
  storedWidths(originalWidth)
    .map((w) => `${imageUrl(id, w)} ${w}w`)
    .join(', ');

/** The height of a stored width, rounded as the server rounds it when resizing. */
export const scaledHeight = (original: { width: number; height: number }, width: number) => Math.max(1, Math.round((original.height * width) / original.width));

/** What the editor inserts for a fresh upload (alt text left for the author to write). */
export const imageMarkdown = (img: { id: string; width: number; height: number }, alt = '') =>
  `![${alt.replace(/[[\]\\]/g, '')}](${imageUrl(img.id, defaultWidth(img.width))}#${img.width}x${img.height})`;

/**
 * The attributes an image element gets in both renderers, or null when the source is not one of ours
 * (then the image is dropped: our content-security policy would block it anyway).
 */
export function imageAttributes(src: string | null | undefined, alt: string) {
  const ref = parseImageSrc(src);
  if (!ref) return null;
  const attrs: { src: string; alt: string; width?: number; height?: number; srcSet?: string; sizes?: string; loading: 'lazy'; decoding: 'async' } = {
    src: imageUrl(ref.id, ref.width),
    alt,
    loading: 'lazy',
    decoding: 'async',
  };
  if (ref.original) {
    const shown = Math.min(ref.width, ref.original.width);
    attrs.width = shown;
    attrs.height = scaledHeight(ref.original, shown);
    attrs.srcSet = imageSrcset(ref.id, ref.original.width);
    attrs.sizes = IMAGE_SIZES;
  }
  return attrs;
}

/** Markdown images (`![alt](src)`) with their alt text, in order; for the alt-text check on submit and in the editor. */
export function markdownImages(markdown: string): Array<{ alt: string; src: string; ref: ImageRef | null }> {
  const out: Array<{ alt: string; src: string; ref: ImageRef | null }> = [];
  // Alt text without brackets (what the editor writes); a nested bracket would make it a link text, which is rare in prose.
  const pattern = /!\[([^\]\n]*)\]\(\s*<?([^)\s>]+)>?(?:\s+"[^"]*")?\s*\)/g;
  for (const m of markdown.matchAll(pattern)) out.push({ alt: m[1].trim(), src: m[2], ref: parseImageSrc(m[2]) });
  return out;
}

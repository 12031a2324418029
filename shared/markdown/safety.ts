import { defaultSchema } from 'rehype-sanitize';

/**
 * GitHub's sanitizing schema, narrowed: links only http(s) and relative, images only relative (no
 * protocol at all). After sanitizing, both renderers keep an image only when its source is one of our own
 * `/api/images/<id>/<width>` URLs (`imageAttributes` in ./images.ts) and drop every other one, so the schema
 * and that one function together decide. The reader pages (rendered to HTML on the server) and the live
 * previews (rendered in the browser) both sanitize with this one schema, so an author sees what readers will get.
 */
export const sanitizeSchema = {
  ...defaultSchema,
  protocols: { ...defaultSchema.protocols, href: ['http', 'https'], src: [] },
};

/** The href a rendered link keeps: http(s) and relative only; anything else (javascript:, data:, protocol-relative) is dropped. */
export function safeHref(href: string | undefined | null): string | undefined {
  if (!href) return undefined;
  if (/^(https?:)?\/\//i.test(href)) return /^https?:\/\//i.test(href) ? href : undefined;
  if (/^[a-z][a-z0-9+.-]*:/i.test(href)) return undefined;
  return href;
}

/** External links open in a new tab, without referrer or opener. */
export const isExternalHref = (href: string) => /^https?:\/\//i.test(href);

/** The fenced-block language that marks a live worked example. */
export const WORKED_EXAMPLE_LANGUAGE = 'worked-example';

import fs from 'node:fs';
import path from 'node:path';
import escapeHtml from 'escape-html';

/** The built index.html, ready to fill. */
export type Shell = { plain: string; render(parts: ShellParts): string };

type ManifestChunk = { file: string; imports?: string[]; css?: string[] };

export type ShellParts = {
  /** Markup for inside #root (a page the server drew). */
  appHtml?: string;
  /** JSON for the page's first render, put in a non-executing data block. */
  data?: unknown;
  dataId?: string;
  title?: string;
  description?: string;
  /** Vite manifest keys of route modules the page needs first (fetched in parallel with the entry). */
  preload?: string[];
};

// The faces the first screen of most pages draws with. Fetched with the stylesheet instead of after
// layout, so text is first painted in its own font and does not grow (or re-flow) when it arrives.
// One face, the body text's: the faces are `font-display: optional` (vite.config.ts), so a face only shows on a
// first visit if it arrives at once; more preloads would compete with the stylesheet and the page for the line.
const FIRST_SCREEN_FONTS = [/inter-latin-400-normal\.woff2$/];

/**
 * Puts `value` in place of the first match of `pattern`, literally. `String.prototype.replace` with a
 * string as the replacement expands `$&`, `$'`, `$\``, `$1`… inside it, so user text passed that way
 * could copy parts of the document into itself (close an attribute, duplicate the page): every fill of
 * the shell goes through this, never through a replacement string.
 */
const fill = (html: string, pattern: string | RegExp, value: (match: string, ...groups: string[]) => string) =>
  html.replace(pattern, value as (match: string, ...rest: unknown[]) => string);

/** JSON that cannot end its <script> element or break a line terminator rule. */
export const jsonForScript = (value: unknown) =>
  JSON.stringify(value)
    .replace(/</g, '\\u003c')
    .replace(/>/g, '\\u003e')
    .replace(/&/g, '\\u0026')
    .replace(/\u2028/g, '\\u2028')
    .replace(/\u2029/g, '\\u2029');

/**
 * The built index.html as a template: the page title and description, preload hints for a route's
 * chunks (from Vite's manifest) and, for a page drawn on the server, its markup and data.
 */
export function loadShell(distDir: string): Shell {
  const template = fs.readFileSync(path.join(distDir, 'index.html'), 'utf8');
  const manifestPath = path.join(distDir, '.vite', 'manifest.json');
  const manifest: Record<string, ManifestChunk> = fs.existsSync(manifestPath) ? JSON.parse(fs.readFileSync(manifestPath, 'utf8')) : {};
  // What index.html already loads itself.
  const inEntry = new Set<string>();
  const walk = (key: string, into: Set<string>) => {
    const chunk = manifest[key];
    if (!chunk || into.has(chunk.file)) return;
    into.add(chunk.file);
    for (const dep of chunk.imports ?? []) walk(dep, into);
  };
  walk('index.html', inEntry);
  const fontTags = Object.entries(manifest)
    .filter(([key]) => FIRST_SCREEN_FONTS.some((re) => re.test(key)))
    .map(([, chunk]) => `<link rel="preload" as="font" type="font/woff2" crossorigin href="/${escapeHtml(chunk.file)}">`)
    .join('');

  const preloadTags = new Map<string, string>();
  const preloadFor = (key: string) => {
    let tags = preloadTags.get(key);
    if (tags === undefined) {
      const files = new Set<string>();
      walk(key, files);
      tags = [...files]
        .filter((f) => !inEntry.has(f))
        .map((f) => `<link rel="modulepreload" crossorigin href="/${escapeHtml(f)}">`)
        .join('');
      preloadTags.set(key, tags);
    }
    return tags;
  };

  // The app itself is a chunk the tiny entry imports; fetch it with the entry, on every page.
  const headTags = fontTags + preloadFor('src/app/start.tsx');
  const base = headTags ? fill(template, '</head>', () => `${headTags}</head>`) : template;

  return {
    /** The plain shell: the browser draws everything. */
    plain: base,
    render(parts: ShellParts): string {
      let html = base;
      const { title, description } = parts;
      if (title) html = fill(html, /<title>[^<]*<\/title>/, () => `<title>${escapeHtml(title)} · Tunewright</title>`);
      if (description) html = fill(html, /(<meta name="description" content=")[^"]*(")/, (_m, open, close) => `${open}${escapeHtml(description)}${close}`);
      const head = (parts.preload ?? []).map(preloadFor).join('');
      if (head) html = fill(html, '</head>', () => `${head}</head>`);
      if (parts.appHtml !== undefined) {
        const data =
          parts.data === undefined
            ? ''
            : `<script type="application/json" id="${escapeHtml(parts.dataId ?? 'initial-data')}">${jsonForScript(parts.data)}</script>`;
        const appHtml = parts.appHtml;
        html = fill(html, '<div id="root"></div>', () => `<div id="root">${appHtml}</div>${data}`);
      }
      return html;
    },
  };
}

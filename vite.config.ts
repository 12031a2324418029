import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import type { Plugin } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';

/**
 * Writes a brotli (.br, quality 11) and a gzip (.gz, level 9) copy beside every text file of the build,
 * so the server sends the smallest encoding the browser accepts without compressing on each request.
 * Fonts (woff2) and images are compressed already; files under 1 KB gain nothing.
 */
function precompress(): Plugin {
  let outDir = 'dist';
  return {
    name: 'tunewright-precompress',
    apply: 'build',
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir);
    },
    // After the service worker is written (vite-plugin-pwa also writes in closeBundle), so sw.js is compressed too.
    closeBundle: {
      order: 'post',
      sequential: true,
      handler() {
        compressTree(outDir);
      },
    },
  };
}

function compressTree(outDir: string) {
  const walk = (dir: string): string[] =>
    fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? walk(path.join(dir, e.name)) : [path.join(dir, e.name)]));
  for (const file of walk(outDir)) {
    if (!/\.(js|mjs|css|html|svg|json|webmanifest|txt)$/.test(file)) continue;
    const raw = fs.readFileSync(file);
    if (raw.length < 1024) continue;
    fs.writeFileSync(
      `${file}.br`,
      zlib.brotliCompressSync(raw, { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 11, [zlib.constants.BROTLI_PARAM_SIZE_HINT]: raw.length } }),
    );
    fs.writeFileSync(`${file}.gz`, zlib.gzipSync(raw, { level: 9 }));
  }
}

/**
 * The @fontsource faces say `font-display: swap`; the build makes them `optional`. A face that has not
 * arrived within the browser's short block period (about 100 ms) is not used on that page at all: text
 * paints at once in the fallback and never reflows, and the Largest Contentful Paint never waits for a
 * font. The next page (font cached) uses it. The server preloads the one face most of the first screen
 * uses (server/lib/html-shell.ts), so on a fair connection even the first page gets it.
 * Tailwind inlines the @imports itself, so the rewrite is on the emitted stylesheet, not the package files.
 */
function optionalFonts(): Plugin {
  return {
    name: 'tunewright-optional-fonts',
    apply: 'build',
    generateBundle(_options, bundle) {
      for (const out of Object.values(bundle)) {
        if (out.type !== 'asset' || !out.fileName.endsWith('.css')) continue;
        const css = typeof out.source === 'string' ? out.source : Buffer.from(out.source).toString('utf8');
        out.source = css.replace(/(@font-face\s*\{[^}]*?font-display:\s*)swap/g, '$1optional');
      }
    },
  };
}

/**
 * With TW_CHUNK_REPORT=1 (`npm run bench:web -- --why`), writes dist/.vite/chunk-modules.json: for every
 * chunk file, the packages (or our own folders) inside it and how many bytes of code each adds, so the
 * bench can say what weighs on a page. Off in normal builds; dot-folders are never served.
 */
function chunkReport(): Plugin {
  return {
    name: 'tunewright-chunk-report',
    apply: () => process.env.TW_CHUNK_REPORT === '1',
    generateBundle(_options, bundle) {
      const report: Record<string, Record<string, number>> = {};
      for (const out of Object.values(bundle)) {
        if (out.type !== 'chunk') continue;
        const parts: Record<string, number> = {};
        for (const [id, mod] of Object.entries(out.modules)) {
          const key = moduleGroup(id);
          parts[key] = (parts[key] ?? 0) + mod.renderedLength;
        }
        report[out.fileName] = parts;
      }
      this.emitFile({ type: 'asset', fileName: '.vite/chunk-modules.json', source: JSON.stringify(report, null, 1) });
    },
  };
}

/** A package name for a module in node_modules, else its folder under src/ or shared/. */
function moduleGroup(id: string): string {
  const clean = id.replace(/\\/g, '/').replace(/\?.*$/, '');
  const at = clean.lastIndexOf('/node_modules/');
  if (at >= 0) return /^((?:@[^/]+\/)?[^/]+)/.exec(clean.slice(at + '/node_modules/'.length))![1];
  const own = /\/((?:src|shared)\/(?:[^/]+\/)?[^/]+)/.exec(clean);
  return own ? own[1] : clean.slice(-40);
}

/**
 * The installable app and its service worker (src/sw.ts, see DEVELOPERS.md "Offline"). The worker is our own
 * file with Workbox's precaching and routing; the plugin only builds it and injects the precache manifest:
 * every script, stylesheet and the shell of this build, plus the Latin faces of the two fonts (other
 * scripts' faces load from the network when a page needs them). The app registers the worker itself
 * (src/lib/offline/register.ts), after it has started, so nothing is injected into index.html.
 */
const pwa = VitePWA({
  strategies: 'injectManifest',
  srcDir: 'src',
  filename: 'sw.ts',
  injectRegister: false,
  registerType: 'prompt',
  manifestFilename: 'manifest.webmanifest',
  includeManifestIcons: false,
  injectManifest: {
    globPatterns: ['**/*.{js,css,html,svg,png,webmanifest}', 'assets/*-latin-[0-9]*-normal-*.woff2'],
    // The browser fetches the install icons itself; no page needs them to draw.
    globIgnores: ['**/node_modules/**', 'sw.js', 'icons/**'],
    maximumFileSizeToCacheInBytes: 2 * 1024 * 1024,
    // A classic script: registered without `type: 'module'`, which older phone browsers refuse for workers.
    rollupFormat: 'iife',
  },
  manifest: {
    id: '/',
    name: 'Tunewright — ESC settings and tuning guides',
    short_name: 'Tunewright',
    description: 'Speed-controller settings, tuning guides and your own setups and runs, readable in the pits without a signal.',
    start_url: '/',
    scope: '/',
    display: 'standalone',
    background_color: '#f6f0e4',
    theme_color: '#1d2a44',
    icons: [
      { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
      { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
      { src: '/icons/maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
      { src: '/favicon.svg', sizes: 'any', type: 'image/svg+xml', purpose: 'any' },
    ],
  },
});

const apiTarget = `http://127.0.0.1:${process.env.API_PORT ?? 3001}`;

export default defineConfig({
  plugins: [react(), tailwindcss(), optionalFonts(), pwa, precompress(), chunkReport()],
  define: {
    // Which build a page runs (shown nowhere; the update test reads it from <html data-build>).
    __TW_BUILD__: JSON.stringify(process.env.TW_BUILD_ID ?? new Date().toISOString()),
  },
  resolve: {
    alias: {
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
      '@': fileURLToPath(new URL('./src', import.meta.url)),
    },
  },
  publicDir: 'src/public',
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    sourcemap: false,
    // The server reads it to preload a pre-rendered page's route chunks (server/lib/html-shell.ts).
    manifest: true,
    chunkSizeWarningLimit: 1800,
    rolldownOptions: {
      output: {
        // Vendor chunks by what pages share (DEVELOPERS.md "Chunks"): each page transfers the framework and
        // core once (they change rarely, so they stay cached across deployments), then only its own code.
        // Everything not named here is split by the bundler per page as before (our features, charts, editor).
        codeSplitting: {
          groups: [
            // Every page: React, React DOM and the router.
            {
              name: 'framework',
              test: /[\\/]node_modules[\\/](react|react-dom|scheduler|react-router|react-router-dom|cookie|set-cookie-parser)[\\/]/,
              priority: 30,
            },
            // Every page too: data fetching and the client's small shared library (API client, offline
            // bookkeeping, constants). Small files on their own cost a request each.
            {
              name: 'core',
              test: /[\\/]node_modules[\\/]@tanstack[\\/](query-core|react-query)[\\/]|[\\/]src[\\/]lib[\\/](api-client|query-client|offline[\\/](worker|saved-copy|update))\.|[\\/]shared[\\/](constants|offline|paths)\.ts$|[\\/]src[\\/]components[\\/]ui[\\/](card|button|notice|dialog|field|when-near)\.tsx$|[\\/]src[\\/]lib[\\/]rendered-html\.tsx$/,
              priority: 20,
            },
            // A guide's baseline setup card and what it shows (labels, values, cautions): one chunk, loaded after the
            // guide has painted (src/app/routes/guide.tsx), and by the setup pages.
            {
              name: 'baseline',
              test: /[\\/]src[\\/]features[\\/]setups[\\/](components[\\/](setup-sheet|computed-values|caution-list|record-table)|labels|api[\\/]setups)\.tsx?$|[\\/]shared[\\/]setup[\\/](fields|show-value|choices)\.ts$|[\\/]shared[\\/]calc[\\/]chemistry\.ts$/,
              priority: 15,
            },
            // Markdown to React (the editor's preview, the review screen): never on a reading page, which gets
            // the server's HTML.
            // (The group takes the three packages and, by default, what they import; the editor's own extras such as
            // its raw-HTML and highlighting plugins stay in the editor's chunk.)
            { name: 'reading', test: /[\\/]node_modules[\\/](react-markdown|remark-gfm|rehype-sanitize)[\\/]/, priority: 10 },
          ],
        },
      },
    },
  },
  server: {
    host: '127.0.0.1',
    port: Number(process.env.PORT ?? 5173),
    proxy: {
      '/api': { target: apiTarget, changeOrigin: false },
      '/schemas': { target: apiTarget, changeOrigin: false },
    },
  },
});

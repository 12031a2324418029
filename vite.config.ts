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
  plugins: [react(), tailwindcss(), pwa, precompress()],
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

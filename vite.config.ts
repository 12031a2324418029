import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import type { Plugin } from 'vite';

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
    closeBundle() {
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
    },
  };
}

const apiTarget = `http://127.0.0.1:${process.env.API_PORT ?? 3001}`;

export default defineConfig({
  plugins: [react(), tailwindcss(), precompress()],
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

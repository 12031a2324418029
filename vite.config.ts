import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';

const apiTarget = `http://127.0.0.1:${process.env.API_PORT ?? 3001}`;

export default defineConfig({
  plugins: [react(), tailwindcss()],
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

// Renderer build: static files only, relative URLs (served from the app's custom protocol or the
// harness), nothing inline so the strict CSP (script-src 'self', style-src 'self') holds.
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import { fileURLToPath } from 'node:url';

const here = fileURLToPath(new URL('.', import.meta.url));

export default defineConfig({
  root: here,
  base: './',
  plugins: [react()],
  build: {
    outDir: fileURLToPath(new URL('../dist/renderer', import.meta.url)),
    emptyOutDir: true,
    // Assets as files, never data: URLs (fonts from data: would break font-src 'self').
    assetsInlineLimit: 0,
    modulePreload: { polyfill: false },
    sourcemap: true,
    target: 'chrome130',
  },
  server: { host: '127.0.0.1' },
});

/**
 * Build of the browser view (`npm run build`, or on demand by `furrow view`): static files in
 * src/web/dist that any static host can serve. Paths are relative (base './'), so the folder
 * works under any URL prefix; the sweep workers are ES module workers, which browsers load only
 * over http(s), never from a file:// page.
 */
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';

const webRoot = fileURLToPath(new URL('.', import.meta.url));
const repoRoot = fileURLToPath(new URL('../..', import.meta.url));

export default defineConfig({
  root: webRoot,
  base: './',
  // no public folder and no .env lookups outside the page's own folder
  publicDir: false,
  envDir: webRoot,
  logLevel: 'warn',
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    target: 'es2022',
    // plotly's bundle is one large, already minified file
    chunkSizeWarningLimit: 6000,
    reportCompressedSize: false,
  },
  worker: { format: 'es' },
  server: { fs: { allow: [repoRoot] } },
});

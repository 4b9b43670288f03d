// Bundles the Node-side entry points with esbuild. The preload must be ONE CommonJS file
// (sandboxed preloads can require only 'electron' and a few built-ins); the shell and the CLI are
// bundled too, so the packaged app needs no node_modules beside them.
import { build } from 'esbuild';
import { existsSync } from 'node:fs';

const esmRequireBanner = {
  js: "import { createRequire as __wbCreateRequire } from 'node:module'; const require = __wbCreateRequire(import.meta.url);",
};

const common = {
  bundle: true,
  platform: 'node',
  target: 'node20',
  sourcemap: true,
  logLevel: 'warning',
  external: ['electron'],
};

const entries = [
  { in: 'main/shell/index.ts', out: 'dist/main/shell.cjs', format: 'cjs' },
  { in: 'main/preload.ts', out: 'dist/main/preload.cjs', format: 'cjs' },
  { in: 'main/cli.ts', out: 'dist/main/cli.mjs', format: 'esm', banner: { js: '#!/usr/bin/env node\n' + esmRequireBanner.js } },
  { in: 'main/harness/server.ts', out: 'dist/main/harness.mjs', format: 'esm', banner: esmRequireBanner },
  // The spreadsheet parser runs in this worker (main/services/untrusted), found beside the bundles.
  { in: 'main/services/untrusted/worker.ts', out: 'dist/main/importWorker.mjs', format: 'esm', banner: esmRequireBanner },
];

for (const e of entries) {
  if (!existsSync(e.in)) {
    console.warn(`build-main: ${e.in} does not exist yet; skipped`);
    continue;
  }
  await build({
    ...common,
    entryPoints: [e.in],
    outfile: e.out,
    format: e.format,
    banner: e.banner,
    // CommonJS bundles take their own path from __filename first; import.meta is only the ESM fallback.
    logOverride: e.format === 'cjs' ? { 'empty-import-meta': 'silent' } : {},
  });
}

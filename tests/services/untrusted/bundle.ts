/**
 * Builds the parsing worker the way the production build does (scripts/build-main.mjs: esbuild,
 * bundled, node20, ESM with a `require` banner), so the tests run the bundled worker too.
 */
import { build } from 'esbuild';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { BUNDLED_WORKER_NAME, type WorkerEntry } from '../../../main/services/untrusted';

export async function bundledWorkerEntry(): Promise<WorkerEntry> {
  const dir = mkdtempSync(join(tmpdir(), 'wb-worker-'));
  const outfile = join(dir, BUNDLED_WORKER_NAME);
  await build({
    entryPoints: [fileURLToPath(new URL('../../../main/services/untrusted/worker.ts', import.meta.url))],
    outfile,
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'esm',
    logLevel: 'silent',
    external: ['electron'],
    banner: { js: "import { createRequire as __wbCreateRequire } from 'node:module'; const require = __wbCreateRequire(import.meta.url);" },
  });
  return { kind: 'file', path: outfile };
}

/**
 * Where the parsing worker's code is. Two cases:
 * - from source (vitest, tsx): this file is .ts, so the worker is ./worker.ts, started through a
 *   tiny bootstrap that registers tsx's loader inside the worker first (Node 20 does not apply a
 *   worker's `execArgv: ['--import', 'tsx']` to its entry file, so that simpler route fails);
 * - bundled (dist/main/*.cjs|*.mjs): the worker is the separately bundled importWorker.mjs in the
 *   same folder as the bundle that imports this module.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

export type WorkerEntry =
  /** A file Node can run as it is (a bundled .mjs). */
  | { readonly kind: 'file'; readonly path: string }
  /** Source for `new Worker(code, { eval: true })`. */
  | { readonly kind: 'eval'; readonly code: string };

/** File name of the bundled worker, beside the bundle that uses it. */
export const BUNDLED_WORKER_NAME = 'importWorker.mjs';

export function defaultWorkerEntry(): WorkerEntry {
  const here = ownFile();
  if (here.endsWith('.ts')) return sourceWorkerEntry(join(dirname(here), 'worker.ts'), here);
  return { kind: 'file', path: unpackedPath(join(dirname(here), BUNDLED_WORKER_NAME)) };
}

/**
 * In a packaged app the bundles sit inside app.asar; the worker file is unpacked beside it
 * (electron.config.ts `asarUnpack`) so that worker_threads can start it from a real file.
 */
export function unpackedPath(path: string): string {
  return path.replace(/([\\/])app\.asar([\\/])/, '$1app.asar.unpacked$2');
}

/** A TypeScript worker file run through tsx's ESM loader (development and tests only). */
export function sourceWorkerEntry(workerTs: string, resolveFrom: string = ownFile()): WorkerEntry {
  const tsxApi = pathToFileURL(tsxEsmApi(resolveFrom)).href;
  const target = pathToFileURL(workerTs).href;
  const code =
    `import(${JSON.stringify(tsxApi)})` +
    '.then((m) => { m.register(); ' +
    `return import(${JSON.stringify(target)}); });`;
  return { kind: 'eval', code };
}

/**
 * tsx's ESM API file, found through the "import" condition of its package exports
 * (`require.resolve` would pick the CommonJS variant, whose dynamic import does not resolve).
 */
function tsxEsmApi(resolveFrom: string): string {
  const manifestPath = createRequire(resolveFrom).resolve('tsx/package.json');
  const manifest: unknown = JSON.parse(readFileSync(manifestPath, 'utf8'));
  const target: unknown = (manifest as { exports?: Record<string, { import?: { default?: unknown } }> }).exports?.['./esm/api']?.import?.default;
  if (typeof target !== 'string') throw new Error('tsx does not export ./esm/api for import');
  return join(dirname(manifestPath), target);
}

/** This module's own file: `__filename` in a CommonJS bundle, `import.meta.url` in ESM. */
function ownFile(): string {
  if (typeof __filename === 'string' && __filename !== '') return __filename;
  return fileURLToPath(import.meta.url);
}

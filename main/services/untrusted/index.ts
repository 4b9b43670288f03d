/**
 * Spreadsheet import with the parsing outside the calling thread. The file is checked against a
 * size limit (fstat, before a byte is read), read here, and handed to a worker_threads Worker that
 * runs the spreadsheet service on the bytes under a heap limit; the worker is terminated when the
 * time limit passes. What comes back is validated (resultSchemas.ts) before anyone sees it, and a
 * worker whose built-in prototypes changed during a job is discarded together with its result.
 *
 * Plain Node: no 'electron'. The same worker module can serve an Electron utilityProcess later.
 * Results have the spreadsheet service's shapes; extra Failure codes: 'too-large' (file size or
 * memory limit), 'timeout' (time limit), 'internal' (the importer itself failed).
 */
import { createHash } from 'node:crypto';
import { constants } from 'node:fs';
import { open } from 'node:fs/promises';
import { basename } from 'node:path';
import { Worker } from 'node:worker_threads';
import type { z } from 'zod';
import type { CourseProject, Failure, ImportLayout, ImportProblem, Result, WorkbookPreview } from '../../../renderer/bridge/contract';
import { describeIssues } from '../schemas';
import { previewMergeBooks, type ImportOutcome, type MergeDetails, type ReadOverride } from '../spreadsheet';
import { DEFAULT_RAISE_HINT, formatBytes, formatMillis, resolveLimits, tooLargeFailure, type ImportLimits } from './limits';
import { jobReplySchema, readyMessageSchema, type JobKind, type JobRequest, type TestOnlyHooks } from './protocol';
import { detectOutcomeSchema, importOutcomeSchema, resultSchema, workbookPreviewSchema, type DetectOutcome } from './resultSchemas';
import { defaultWorkerEntry, type WorkerEntry } from './workerEntry';

export { checkFileSize, DEFAULT_IMPORT_LIMITS, DEFAULT_RAISE_HINT, limitsFromRequest, resolveLimits, type ImportLimits } from './limits';
export { BUNDLED_WORKER_NAME, defaultWorkerEntry, sourceWorkerEntry, type WorkerEntry } from './workerEntry';
export type { TestOnlyHooks } from './protocol';
export type { DetectOutcome } from './resultSchemas';

export interface IsolatedImportOptions {
  /** Any limit left out takes its default (DEFAULT_IMPORT_LIMITS). */
  readonly limits?: Partial<ImportLimits>;
  /** Where the user raises a limit, ending the limit messages: "… raise the time limit <hint>." */
  readonly raiseHint?: string;
  /** The worker's code; defaults to the source or bundled worker beside this module. */
  readonly workerEntry?: WorkerEntry;
  /** TESTS ONLY (see TestOnlyHooks). */
  readonly testOnly?: TestOnlyHooks;
}

export interface IsolatedImporter {
  readonly limits: ImportLimits;
  preview(path: string, override?: ReadOverride): Promise<Result<WorkbookPreview>>;
  importLayout(path: string, layout: ImportLayout): Promise<Result<ImportOutcome>>;
  detectAndImport(path: string): Promise<Result<DetectOutcome>>;
  previewMerge(current: CourseProject, path: string, layout: ImportLayout): Promise<Result<MergeDetails & { problems: readonly ImportProblem[] }>>;
  /** Ends the worker; later calls start a new one. */
  close(): Promise<void>;
}

/** One import in its own worker: the worker is started for this call and ended after it. */
export async function previewSpreadsheetIsolated(path: string, options?: IsolatedImportOptions & { override?: ReadOverride }): Promise<Result<WorkbookPreview>> {
  return once(options, (im) => im.preview(path, options?.override));
}

export async function importSpreadsheetIsolated(path: string, layout: ImportLayout, options?: IsolatedImportOptions): Promise<Result<ImportOutcome>> {
  return once(options, (im) => im.importLayout(path, layout));
}

export async function detectAndImportIsolated(path: string, options?: IsolatedImportOptions): Promise<Result<DetectOutcome>> {
  return once(options, (im) => im.detectAndImport(path));
}

export async function previewMergeIsolated(
  current: CourseProject,
  path: string,
  layout: ImportLayout,
  options?: IsolatedImportOptions,
): Promise<Result<MergeDetails & { problems: readonly ImportProblem[] }>> {
  return once(options, (im) => im.previewMerge(current, path, layout));
}

async function once<T>(options: IsolatedImportOptions | undefined, run: (im: IsolatedImporter) => Promise<Result<T>>): Promise<Result<T>> {
  const made = createIsolatedImporter(options);
  if (!made.ok) return made;
  try {
    return await run(made.value);
  } finally {
    await made.value.close();
  }
}

/**
 * An importer that keeps one worker between calls (jobs run one at a time). A worker that timed
 * out, ran out of memory, threw or had its prototypes changed is discarded; the next call starts
 * a fresh one.
 */
export function createIsolatedImporter(options: IsolatedImportOptions = {}): Result<IsolatedImporter> {
  const resolved = resolveLimits(options.limits);
  if (!resolved.ok) return resolved;
  const limits = resolved.limits;
  const hint = options.raiseHint ?? DEFAULT_RAISE_HINT;
  const entry = options.workerEntry ?? defaultWorkerEntry();
  let worker: LiveWorker | null = null;
  let queue: Promise<unknown> = Promise.resolve();
  let nextId = 1;

  const serial = <T>(task: () => Promise<T>): Promise<T> => {
    const run = queue.then(task, task);
    queue = run.catch(() => undefined);
    return run;
  };

  const discard = async (): Promise<void> => {
    const w = worker;
    worker = null;
    if (w !== null) await w.end();
  };

  async function job<S extends z.ZodType>(kind: JobKind, path: string, extra: Pick<JobRequest, 'override' | 'layout'>, schema: S): Promise<{ result: Result<z.output<S>>; sha256: string | null }> {
    const fileName = basename(path);
    const read = await readLimited(path, limits.maxBytes, hint);
    if (!read.ok) return { result: read, sha256: null };
    const bytes = read.value;
    const sha256 = createHash('sha256').update(bytes).digest('hex');
    if (worker === null) {
      const started = await LiveWorker.start(entry, limits);
      if (!started.ok) return { result: internal(fileName, started.error), sha256 };
      worker = started.value;
    }
    const request: JobRequest = {
      type: 'job',
      id: nextId++,
      kind,
      bytes,
      fileName,
      // A reply the worker could not hold flat in its own heap is refused (see replySize.ts).
      maxReplyBytes: limits.maxHeapMb * 1024 * 1024,
      ...extra,
      ...(options.testOnly !== undefined ? { testOnly: options.testOnly } : {}),
    };
    const outcome = await worker.run(request, limits.maxMillis);
    switch (outcome.kind) {
      case 'timeout':
        await discard();
        return {
          result: fail('timeout', `Reading "${fileName}" took longer than ${formatMillis(limits.maxMillis)} and was stopped. The file may be damaged or far larger than a gradebook; if it is the right file, raise the time limit ${hint}.`),
          sha256,
        };
      case 'out-of-memory':
        await discard();
        return { result: outOfMemory(fileName, limits, hint), sha256 };
      case 'died':
        await discard();
        return { result: internal(fileName, outcome.error), sha256 };
      case 'reply': {
        const reply = outcome.reply;
        if (reply.id !== request.id) {
          await discard();
          return { result: internal(fileName, 'the worker answered another request'), sha256 };
        }
        if (reply.pollution.length > 0) {
          await discard();
          return {
            result: fail('bad-input', `The file "${fileName}" was refused: reading it changed built-in objects of the program (${reply.pollution.slice(0, 3).join(', ')}), which a genuine spreadsheet never does. Open it in your spreadsheet program and save a fresh copy, or ask whoever sent it.`),
            sha256,
          };
        }
        if (reply.outcome === 'oversized') {
          if (reply.reason === 'reply') await discard();
          return { result: reply.reason === 'declared' ? declaredTooLarge(fileName, reply.bytes, limits, hint) : outOfMemory(fileName, limits, hint), sha256 };
        }
        if (reply.outcome === 'threw') {
          await discard();
          return { result: internal(fileName, reply.error), sha256 };
        }
        const checked = resultSchema(schema).safeParse(reply.result);
        if (!checked.success) {
          return {
            result: fail('bad-input', `The file "${fileName}" was read, but what came out of it failed Weighbridge's checks (${describeIssues(checked.error, ['result'], 3)}). Nothing was imported; save the file again from your spreadsheet program and try once more.`),
            sha256,
          };
        }
        return { result: checked.data as Result<z.output<S>>, sha256 };
      }
    }
  }

  const importer: IsolatedImporter = {
    limits,
    preview: (path, override) =>
      serial(async () => {
        const { result } = await job('preview', path, override !== undefined ? { override } : {}, workbookPreviewSchema);
        // Like previewSpreadsheet: `path` is the full path, not just the file name.
        return result.ok ? { ok: true, value: { ...result.value, path } } : result;
      }),
    importLayout: (path, layout) => serial(async () => (await job('import', path, { layout }, importOutcomeSchema)).result),
    detectAndImport: (path) => serial(async () => (await job('detect', path, {}, detectOutcomeSchema)).result),
    previewMerge: (current, path, layout) =>
      serial(async () => {
        const { result, sha256 } = await job('import', path, { layout }, importOutcomeSchema);
        if (!result.ok) return result;
        if (sha256 === null) return internal(basename(path), 'no checksum');
        // Merging is plain work on validated data, so it runs here, as in the spreadsheet service.
        const merge = previewMergeBooks(current, result.value.gradebook);
        const source = { path, fileName: basename(path), sha256, importedAt: new Date().toISOString(), layout };
        return { ok: true, value: { ...merge, merged: { ...merge.merged, source }, problems: result.value.problems } };
      }),
    close: () => serial(discard),
  };
  return { ok: true, value: importer };
}

// ---------------------------------------------------------------------------------------------
// Reading under the size limit
// ---------------------------------------------------------------------------------------------

/**
 * The file's bytes, refused before reading when larger than `maxBytes`. The size comes from the
 * open handle (so a file swapped between the check and the read is still the one checked), and
 * only that many bytes are read even if the file grows meanwhile. Not a regular file (a folder, a
 * device, a pipe) is refused: such a "file" may never end.
 */
async function readLimited(path: string, maxBytes: number, hint: string): Promise<Result<Uint8Array>> {
  const name = basename(path);
  let handle;
  try {
    // O_NONBLOCK: opening a named pipe must not wait for a writer (it is refused just below).
    handle = await open(path, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
  } catch (e) {
    return ioFailure(path, e);
  }
  try {
    const info = await handle.stat();
    if (info.isDirectory()) return fail('bad-input', `"${path}" is a folder, not a file. Choose the gradebook file.`);
    if (!info.isFile()) return fail('bad-input', `"${path}" is not an ordinary file (it may be a device or a pipe). Choose the gradebook file.`);
    if (info.size > maxBytes) {
      return tooLargeFailure(name, info.size, maxBytes, hint);
    }
    // Its own ArrayBuffer (never Node's shared pool), so it can be transferred to the worker.
    const bytes = new Uint8Array(info.size);
    let filled = 0;
    while (filled < bytes.length) {
      const { bytesRead } = await handle.read(bytes, filled, bytes.length - filled, filled);
      if (bytesRead === 0) break;
      filled += bytesRead;
    }
    return { ok: true, value: filled === bytes.length ? bytes : bytes.slice(0, filled) };
  } catch (e) {
    return ioFailure(path, e);
  } finally {
    await handle.close().catch(() => undefined);
  }
}

function ioFailure(path: string, e: unknown): Failure {
  const code = typeof e === 'object' && e !== null && 'code' in e && typeof e.code === 'string' ? e.code : undefined;
  if (code === 'ENOENT') return fail('not-found', `The file "${path}" does not exist. Check the path and try again.`);
  if (code === 'EISDIR') return fail('bad-input', `"${path}" is a folder, not a file. Choose the gradebook file.`);
  return fail('io', `The file "${path}" could not be read (${code ?? 'unknown error'}). Check that it is not open elsewhere and that you may read it.`);
}

// ---------------------------------------------------------------------------------------------
// The worker
// ---------------------------------------------------------------------------------------------

type JobOutcome =
  | { readonly kind: 'reply'; readonly reply: z.output<typeof jobReplySchema> }
  | { readonly kind: 'timeout' }
  | { readonly kind: 'out-of-memory' }
  | { readonly kind: 'died'; readonly error: string };

/** Loading the worker's modules is not parsing: it gets its own, fixed bound. */
const STARTUP_MILLIS = 60_000;

class LiveWorker {
  private pending: ((o: JobOutcome) => void) | null = null;
  private dead: JobOutcome | null = null;

  private constructor(private readonly worker: Worker) {
    worker.on('message', (m: unknown) => {
      const reply = jobReplySchema.safeParse(m);
      this.settle(reply.success ? { kind: 'reply', reply: reply.data } : { kind: 'died', error: 'the worker sent a malformed reply' });
    });
    worker.on('error', (e: unknown) => {
      this.dead = isOutOfMemory(e) ? { kind: 'out-of-memory' } : { kind: 'died', error: errorText(e) };
      this.settle(this.dead);
    });
    worker.on('exit', (code) => {
      this.dead ??= { kind: 'died', error: `the worker stopped (exit code ${code})` };
      this.settle(this.dead);
    });
  }

  static start(entry: WorkerEntry, limits: ImportLimits): Promise<{ ok: true; value: LiveWorker } | { ok: false; error: string }> {
    return new Promise((resolve) => {
      let worker: Worker;
      try {
        // execArgv [] : the worker must not inherit the parent's flags (`--input-type`, an
        // inspector port …), which can stop it from starting at all.
        const options = { execArgv: [], resourceLimits: { maxOldGenerationSizeMb: limits.maxHeapMb } };
        worker = entry.kind === 'eval' ? new Worker(entry.code, { ...options, eval: true }) : new Worker(entry.path, options);
      } catch (e) {
        resolve({ ok: false, error: errorText(e) });
        return;
      }
      const timer = setTimeout(() => finish({ ok: false, error: 'the worker did not start' }), STARTUP_MILLIS);
      const finish = (r: { ok: true; value: LiveWorker } | { ok: false; error: string }): void => {
        clearTimeout(timer);
        worker.off('message', onMessage);
        worker.off('error', onError);
        worker.off('exit', onExit);
        if (!r.ok) void worker.terminate();
        resolve(r);
      };
      const onMessage = (m: unknown): void => {
        if (readyMessageSchema.safeParse(m).success) {
          const live = new LiveWorker(worker);
          worker.unref();
          finish({ ok: true, value: live });
        } else finish({ ok: false, error: 'the worker sent an unexpected first message' });
      };
      const onError = (e: unknown): void => finish({ ok: false, error: errorText(e) });
      const onExit = (code: number): void => finish({ ok: false, error: `the worker stopped while starting (exit code ${code})` });
      worker.on('message', onMessage);
      worker.on('error', onError);
      worker.on('exit', onExit);
    });
  }

  run(request: JobRequest, maxMillis: number): Promise<JobOutcome> {
    if (this.dead !== null) return Promise.resolve(this.dead);
    return new Promise((resolve) => {
      this.worker.ref();
      const timer = setTimeout(() => {
        this.pending = null;
        this.worker.unref();
        resolve({ kind: 'timeout' });
      }, maxMillis);
      this.pending = (o) => {
        clearTimeout(timer);
        this.worker.unref();
        resolve(o);
      };
      try {
        this.worker.postMessage(request, [request.bytes.buffer as ArrayBuffer]);
      } catch (e) {
        this.settle({ kind: 'died', error: errorText(e) });
      }
    });
  }

  async end(): Promise<void> {
    await this.worker.terminate();
  }

  private settle(o: JobOutcome): void {
    const p = this.pending;
    this.pending = null;
    p?.(o);
  }
}

function isOutOfMemory(e: unknown): boolean {
  return typeof e === 'object' && e !== null && 'code' in e && e.code === 'ERR_WORKER_OUT_OF_MEMORY';
}

function outOfMemory(fileName: string, limits: ImportLimits, hint: string): Failure {
  return fail(
    'too-large',
    `Reading "${fileName}" needed more than ${limits.maxHeapMb} MB of memory and was stopped. The file may be damaged or expand to far more data than its size suggests (a compressed workbook can); if it is the right file, raise the memory limit ${hint}.`,
  );
}

function declaredTooLarge(fileName: string, declared: number, limits: ImportLimits, hint: string): Failure {
  return fail(
    'too-large',
    `The file "${fileName}" says it expands to ${formatBytes(declared)} when unpacked, more than the memory limit of ${limits.maxHeapMb} MB, so it was not opened. It may be damaged; if it is the right file, raise the memory limit ${hint}.`,
  );
}

function internal(fileName: string, detail: string): Failure {
  return fail('internal', `Weighbridge could not read "${fileName}" because its importer failed unexpectedly (${detail.length > 160 ? `${detail.slice(0, 160)}…` : detail}). Nothing was imported; save the file again as .xlsx or .csv and try once more.`);
}

function fail(code: string, message: string): Failure {
  return { ok: false, code, message };
}

function errorText(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

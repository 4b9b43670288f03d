/**
 * Limits on one import of an untrusted spreadsheet. A gradebook of a few thousand students is a
 * few megabytes and parses in well under a second; the defaults leave a wide margin above that and
 * stop a damaged or hostile file (a decompression bomb, a sheet that declares a million columns)
 * from freezing or exhausting the app. Every limit can be raised by the user.
 */
import { stat } from 'node:fs/promises';
import { basename } from 'node:path';
import type { Failure, ImportLimitsRequest, Result } from '../../../renderer/bridge/contract';

export interface ImportLimits {
  /** Largest file accepted, in bytes; checked with fstat before the file is read. */
  readonly maxBytes: number;
  /** Longest a parse may run, in milliseconds, before the worker is terminated. */
  readonly maxMillis: number;
  /** V8 old-generation heap of the parsing worker, in MiB (worker_threads resourceLimits). */
  readonly maxHeapMb: number;
}

export const DEFAULT_IMPORT_LIMITS: ImportLimits = Object.freeze({
  maxBytes: 50 * 1024 * 1024,
  maxMillis: 30_000,
  maxHeapMb: 1024,
});

/**
 * Where the user raises a limit, appended to the messages ("… raise the time limit <hint>").
 * The CLI and the window say it in their own terms.
 */
export const DEFAULT_RAISE_HINT = 'in the import limits and try again';

/** Defaults filled in; a limit that is not a positive finite number is refused, not guessed. */
export function resolveLimits(partial: Partial<ImportLimits> | undefined): { ok: true; limits: ImportLimits } | Failure {
  const limits: ImportLimits = { ...DEFAULT_IMPORT_LIMITS, ...(partial ?? {}) };
  for (const key of ['maxBytes', 'maxMillis', 'maxHeapMb'] as const) {
    const v = limits[key];
    if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) {
      return { ok: false, code: 'bad-input', message: `The import limit ${key} must be a positive number (got ${String(v)}).` };
    }
  }
  return { ok: true, limits };
}

/** "50 MB", "1.5 MB", "800 bytes" — binary megabytes, as file managers commonly show them. */
export function formatBytes(n: number): string {
  const mib = n / (1024 * 1024);
  if (mib >= 1) return `${Number(mib.toFixed(mib >= 10 ? 0 : 1))} MB`;
  const kib = n / 1024;
  if (kib >= 1) return `${Number(kib.toFixed(kib >= 10 ? 0 : 1))} KB`;
  return `${n} bytes`;
}

/** "30 s", "1.5 s", "250 ms". */
export function formatMillis(ms: number): string {
  if (ms >= 1000) return `${Number((ms / 1000).toFixed(ms >= 10_000 ? 0 : 1))} s`;
  return `${Math.round(ms)} ms`;
}

/**
 * The window's limits (megabytes, seconds) as ImportLimits, over `base` (the process's own limits);
 * a limit the request leaves out keeps the base's. Binary megabytes, as formatBytes shows them.
 */
export function limitsFromRequest(request: ImportLimitsRequest | undefined, base: Partial<ImportLimits> | undefined): Partial<ImportLimits> {
  return {
    ...(base ?? {}),
    ...(request?.maxMegabytes !== undefined ? { maxBytes: Math.round(request.maxMegabytes * 1024 * 1024) } : {}),
    ...(request?.maxSeconds !== undefined ? { maxMillis: Math.round(request.maxSeconds * 1000) } : {}),
  };
}

/** The refusal of a file over the size limit; the isolated and the direct reading say the same. */
export function tooLargeFailure(fileName: string, size: number, maxBytes: number, hint: string): Failure {
  return {
    ok: false,
    code: 'too-large',
    message: `The file "${fileName}" is ${formatBytes(size)}, larger than the import size limit of ${formatBytes(maxBytes)}. A gradebook is rarely this large: check that it is the right file, or raise the size limit ${hint}.`,
  };
}

/**
 * The size check for a reading done in this process (no worker): stat before the file is read. A
 * path that cannot be stat'ed passes, so that the reading itself reports it in its own words.
 */
export async function checkFileSize(path: string, maxBytes: number, hint: string = DEFAULT_RAISE_HINT): Promise<Result<null>> {
  const info = await stat(path).catch(() => null);
  if (info !== null && info.isFile() && info.size > maxBytes) return tooLargeFailure(basename(path), info.size, maxBytes, hint);
  return { ok: true, value: null };
}

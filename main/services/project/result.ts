/** Small constructors for the contract's `Result`, so services return failures instead of throwing. */
import type { Failure, Result } from '../../../renderer/bridge/contract';

export function ok<T>(value: T): Result<T> {
  return { ok: true, value };
}

export function fail(code: string, message: string, extra?: Pick<Failure, 'problems'>): Failure {
  return extra?.problems ? { ok: false, code, message, problems: extra.problems } : { ok: false, code, message };
}

/** Node's error code (ENOENT, EACCES…) of an unknown thrown value, if any. */
export function errnoCode(error: unknown): string | undefined {
  if (typeof error === 'object' && error !== null && 'code' in error) {
    const code = (error as { code: unknown }).code;
    return typeof code === 'string' ? code : undefined;
  }
  return undefined;
}

/** A failure for an I/O error, in words a user can act on. */
export function ioFailure(action: string, path: string, error: unknown): Failure {
  const code = errnoCode(error);
  if (code === 'ENOENT') return fail('not-found', `${action} failed: "${path}" does not exist. Check the path or choose another file.`);
  if (code === 'EACCES' || code === 'EPERM') {
    return fail('io', `${action} failed: no permission to use "${path}". Choose a folder you can write to, or change the file's permissions.`);
  }
  if (code === 'EISDIR') return fail('bad-input', `${action} failed: "${path}" is a folder, not a file. Choose a file name.`);
  if (code === 'ENOSPC') return fail('io', `${action} failed: the disk holding "${path}" is full. Free some space and try again.`);
  const detail = error instanceof Error ? error.message : String(error);
  return fail('io', `${action} failed for "${path}": ${detail}`);
}

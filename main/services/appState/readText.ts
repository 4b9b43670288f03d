/** Read a small UTF-8 text file of the app's own, with the usual failures as Results. */
import { readFile } from 'node:fs/promises';
import type { Result } from '../../../renderer/bridge/contract';
import { fail, ioFailure, ok } from '../project/result';

export async function readTextFile(path: string, label: string): Promise<Result<string>> {
  let bytes: Buffer;
  try {
    bytes = await readFile(path);
  } catch (error) {
    return ioFailure(`Reading the ${label}`, path, error);
  }
  try {
    return ok(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
  } catch {
    return fail('damaged', `The ${label} "${path}" is damaged: it is not UTF-8 text.`);
  }
}

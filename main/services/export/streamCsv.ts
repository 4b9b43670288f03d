/**
 * Final marks to CSV written in blocks of rows, for a course too large to hold as one table
 * (the command line's streamed `grade`): the same bytes as exportFinals' CSV of the same rows
 * (BOM, CRLF, RFC 4180 quoting, formula-injection defence — writers.ts), the same refusals
 * (checkTargets), and the same atomic replacement: a temp file beside the target, fsync, rename,
 * fsync of the folder.
 */
import { randomBytes } from 'node:crypto';
import { open, rename, stat, unlink } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import type { Result } from '../../../renderer/bridge/contract';
import { fail, ioFailure, ok } from '../project/result';
import { checkTargets, type ExportOutcome } from './exportFinals';
import type { CellValue } from './tables';
import { CSV_BOM, csvLines } from './writers';

export interface CsvRowsTarget {
  readonly path: string;
  /** The gradebook the rows come from: never written. */
  readonly sourcePath: string | null;
  /** A project or plan file in use: never written. */
  readonly projectPath: string | null;
  readonly overwrite: boolean;
}

const BLOCK = 2000;

export async function exportCsvRows(
  target: CsvRowsTarget,
  header: readonly string[],
  rowCount: number,
  rowAt: (i: number) => readonly CellValue[],
): Promise<Result<ExportOutcome>> {
  const { path } = target;
  if (!path.toLowerCase().endsWith('.csv')) return fail('bad-input', `The file name "${basename(path)}" does not end in .csv; choose a name ending in .csv for this export.`);
  try {
    const refused = await checkTargets([path], target.sourcePath, target.projectPath, target.overwrite);
    if (refused !== null) return refused;
    const dir = dirname(path);
    const tmp = join(dir, `.${basename(path)}.${process.pid}.${randomBytes(6).toString('hex')}.tmp`);
    const mode = await stat(path).then((s) => s.mode & 0o7777, () => 0o666);
    const handle = await open(tmp, 'wx', mode);
    try {
      try {
        await handle.write(`${CSV_BOM}${csvLines([header])}\r\n`);
        for (let i = 0; i < rowCount; i += BLOCK) {
          const rows: (readonly CellValue[])[] = [];
          for (let j = i; j < Math.min(rowCount, i + BLOCK); j++) rows.push(rowAt(j));
          await handle.write(`${csvLines(rows)}\r\n`);
        }
        await handle.sync();
      } finally {
        await handle.close();
      }
      await rename(tmp, path);
    } catch (error) {
      await unlink(tmp).catch(() => undefined);
      throw error;
    }
    const folder = await open(dir, 'r').catch(() => null);
    if (folder !== null) await folder.sync().catch(() => undefined).finally(() => folder.close());
  } catch (error) {
    return ioFailure('Exporting the final marks', path, error);
  }
  return ok({ path, rows: rowCount });
}

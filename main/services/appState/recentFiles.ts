/**
 * Recently used project files, most recent first, at most `max`.
 *
 * File `<dir>/recent-files.json`: `{ "format": "weighbridge-recent", "schemaVersion": 1, "paths": [...] }`,
 * written atomically. A damaged list is reported by `list()` (code 'damaged'); the next `add`
 * replaces it with a fresh list, since it holds nothing that cannot be rebuilt.
 */
import { mkdir } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { z } from 'zod';
import type { Result } from '../../../renderer/bridge/contract';
import { writeAtomic } from '../project/atomicWrite';
import { ioFailure, ok } from '../project/result';
import { parseVersioned, type VersionedFormat } from '../project/versionedFile';
import { readTextFile } from './readText';

export const RECENT_FORMAT = 'weighbridge-recent';
export const RECENT_FILE_NAME = 'recent-files.json';

const recentDocumentSchema = z.strictObject({
  format: z.literal(RECENT_FORMAT),
  schemaVersion: z.literal(1),
  paths: z.array(z.string().min(1).max(4096)),
});

const recentFormat: VersionedFormat<z.output<typeof recentDocumentSchema>> = {
  format: RECENT_FORMAT,
  label: 'recent-files list',
  currentVersion: 1,
  migrations: {},
  schema: recentDocumentSchema,
};

export interface RecentFiles {
  list(): Promise<Result<readonly string[]>>;
  /** Put `path` first (absolute, without duplicates); returns the new list. */
  add(path: string): Promise<Result<readonly string[]>>;
  remove(path: string): Promise<Result<readonly string[]>>;
}

export function createRecentFiles(dir: string, max = 10): RecentFiles {
  const file = join(dir, RECENT_FILE_NAME);

  async function list(): Promise<Result<readonly string[]>> {
    const text = await readTextFile(file, 'recent-files list');
    if (!text.ok) return text.code === 'not-found' ? ok([]) : text;
    const parsed = parseVersioned(text.value, recentFormat, 'The recent-files list');
    return parsed.ok ? ok(parsed.value.document.paths.slice(0, max)) : parsed;
  }

  async function store(paths: readonly string[]): Promise<Result<readonly string[]>> {
    const doc = { format: RECENT_FORMAT, schemaVersion: 1, paths };
    try {
      await mkdir(dir, { recursive: true });
      await writeAtomic(file, `${JSON.stringify(doc, null, 2)}\n`);
    } catch (error) {
      return ioFailure('Saving the recent-files list', file, error);
    }
    return ok(paths);
  }

  return {
    list,
    async add(path) {
      const current = await list();
      const absolute = resolve(path);
      const before = current.ok ? current.value : [];
      return store([absolute, ...before.filter((p) => p !== absolute)].slice(0, max));
    },
    async remove(path) {
      const current = await list();
      const absolute = resolve(path);
      return store((current.ok ? current.value : []).filter((p) => p !== absolute));
    },
  };
}

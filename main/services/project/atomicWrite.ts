/**
 * Crash-safe file replacement: write a temporary file in the target's folder, fsync it, rename it
 * over the target, fsync the folder. Rename is atomic within one file system, so a reader — or the
 * next start after a crash or power cut — sees the old bytes or the new bytes, never a mix; the
 * folder fsync makes the rename itself durable.
 *
 * Written here rather than with write-file-atomic because that package names its temporary files
 * from `__filename`, which does not exist in the ESM bundle of the command line (dist/main/cli.mjs).
 *
 * Temporary files are named `.<name>.<pid>.<random>.tmp`. One left behind by a killed process is
 * removed by the next successful save of the same file once that process is gone.
 */
import { randomBytes } from 'node:crypto';
import { open, readFile, readdir, realpath, rename, stat, unlink } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';

/** Flush a directory entry change (rename) to disk. Folders cannot be opened for fsync on Windows. */
async function fsyncDirectory(dir: string): Promise<void> {
  if (process.platform === 'win32') return;
  const handle = await open(dir, 'r');
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}

function isErrno(error: unknown, code: string): boolean {
  return typeof error === 'object' && error !== null && (error as { code?: unknown }).code === code;
}

/** A symbolic link is followed, so saving through it updates the file it points to. */
async function resolveTarget(path: string): Promise<string> {
  try {
    return await realpath(path);
  } catch (error) {
    if (isErrno(error, 'ENOENT')) return resolve(path);
    throw error;
  }
}

function processAlive(pid: number): boolean {
  if (pid === process.pid) return true;
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return !isErrno(error, 'ESRCH');
  }
}

/** Remove temporary files of this target left by processes that no longer exist (best effort). */
async function removeStaleTemps(dir: string, base: string): Promise<void> {
  const prefix = `.${base}.`;
  let names: string[];
  try {
    names = await readdir(dir);
  } catch {
    return;
  }
  for (const name of names) {
    if (!name.startsWith(prefix) || !name.endsWith('.tmp')) continue;
    const m = /^(\d+)\.[0-9a-f]{12}\.tmp$/.exec(name.slice(prefix.length));
    if (m && !processAlive(Number(m[1]))) await unlink(join(dir, name)).catch(() => undefined);
  }
}

/** Replace `path` with `data` atomically (temp + fsync + rename + fsync folder). */
export async function writeAtomic(path: string, data: string | Uint8Array): Promise<void> {
  const target = await resolveTarget(path);
  const dir = dirname(target);
  const base = basename(target);
  const tmp = join(dir, `.${base}.${process.pid}.${randomBytes(6).toString('hex')}.tmp`);
  let mode = 0o666;
  try {
    mode = (await stat(target)).mode & 0o7777;
  } catch (error) {
    if (!isErrno(error, 'ENOENT')) throw error;
  }
  const handle = await open(tmp, 'wx', mode);
  try {
    try {
      await handle.writeFile(data);
      await handle.sync();
    } finally {
      await handle.close();
    }
    await rename(tmp, target);
  } catch (error) {
    await unlink(tmp).catch(() => undefined);
    throw error;
  }
  await fsyncDirectory(dir);
  await removeStaleTemps(dir, base);
}

/**
 * Keep the file at `path` as `backupPath` (atomically) before it is replaced, but only when
 * `isGood(bytes)` says it is worth keeping: a damaged file never overwrites a good backup.
 * Returns true when a backup was written.
 */
export async function keepBackup(path: string, backupPath: string, isGood: (bytes: Buffer) => boolean): Promise<boolean> {
  let bytes: Buffer;
  try {
    bytes = await readFile(path);
  } catch (error) {
    if (isErrno(error, 'ENOENT')) return false;
    throw error;
  }
  if (!isGood(bytes)) return false;
  await writeAtomic(backupPath, bytes);
  return true;
}

/**
 * True when `a` and `b` name the same file: the same resolved path, or (when both exist) the same
 * device and inode — which also catches symbolic and hard links and case-insensitive file systems.
 */
export async function sameFile(a: string, b: string): Promise<boolean> {
  if (resolve(a) === resolve(b)) return true;
  try {
    const [sa, sb] = await Promise.all([stat(a), stat(b)]);
    return sa.dev === sb.dev && sa.ino === sb.ino;
  } catch {
    return false;
  }
}

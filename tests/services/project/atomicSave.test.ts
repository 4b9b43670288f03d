/**
 * Crash safety of project saves, tested for real: a child process saves two known versions in a
 * loop and is killed with SIGKILL at a random moment — 100 times in the normal suite (4 lanes × 25,
 * each lane its own folder; each child costs ~0.2 s of start-up on this machine, so 100 kills take
 * ~16 s). Set WEIGHBRIDGE_CRASH_KILLS (e.g. 1000) for a long run. After every kill the project
 * file must be byte-identical to one of the two versions
 * (never torn) and the kept backup must be one of them too.
 */
import { spawn } from 'node:child_process';
import { mkdtemp, readdir, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseProjectText, saveProject, serialiseProject } from '../../../main/services/project';
import { crashVersions } from './crashVersions';

const LANES = 4;
const KILLS_PER_LANE = Math.ceil(Number(process.env['WEIGHBRIDGE_CRASH_KILLS'] ?? 100) / LANES);

let work: string;
let childJs: string;

beforeAll(async () => {
  work = await mkdtemp(join(tmpdir(), 'wb-crash-'));
  childJs = join(work, 'saveLoopChild.mjs');
  await build({
    entryPoints: [fileURLToPath(new URL('./saveLoopChild.ts', import.meta.url))],
    bundle: true,
    platform: 'node',
    format: 'esm',
    outfile: childJs,
    banner: { js: "import{createRequire}from'module';const require=createRequire(import.meta.url);" },
    logLevel: 'error',
  });
});

afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

/** Start the child, wait for its first completed save, let it run a random while, SIGKILL it. */
function runAndKill(path: string, delayMs: number): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [childJs, path], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.stdout.once('data', () => setTimeout(() => child.kill('SIGKILL'), delayMs));
    child.on('error', reject);
    child.on('exit', (code, signal) => {
      if (signal === 'SIGKILL') resolve();
      else reject(new Error(`child ended with code ${String(code)} before the kill: ${stderr}`));
    });
  });
}

describe('atomic save under SIGKILL', () => {
  it(`survives ${KILLS_PER_LANE * LANES} kills at random points: always the old or the new bytes`, async () => {
    const versions = crashVersions();
    const allowed = versions.map((v) => serialiseProject(v.project, v.savedAt));
    let strayTempFiles = 0;
    const lane = async (n: number): Promise<number> => {
      const dir = await mkdtemp(join(work, `lane${n}-`));
      const path = join(dir, 'course.weighbridge');
      const first = versions[0]!;
      expect((await saveProject(path, first.project, { now: () => new Date(first.savedAt) })).ok).toBe(true);
      let checked = 0;
      for (let k = 0; k < KILLS_PER_LANE; k += 1) {
        await runAndKill(path, Math.floor(Math.random() * 40));
        const text = await readFile(path, 'utf8');
        expect(allowed).toContain(text);
        expect(parseProjectText(text).ok).toBe(true);
        const backup = await readFile(`${path}.bak`, 'utf8');
        expect(allowed).toContain(backup);
        // A temporary file left by this kill shows it landed mid-write; the next save removes it.
        const names = await readdir(dir);
        strayTempFiles += names.filter((f) => f.endsWith('.tmp')).length;
        expect(names.filter((f) => !f.endsWith('.tmp')).sort()).toEqual([basename(path), `${basename(path)}.bak`]);
        checked += 1;
      }
      expect((await saveProject(path, first.project, { now: () => new Date(first.savedAt) })).ok).toBe(true);
      expect((await readdir(dir)).sort()).toEqual([basename(path), `${basename(path)}.bak`]);
      return checked;
    };
    const counts = await Promise.all(Array.from({ length: LANES }, (_, n) => lane(n)));
    expect(counts.reduce((a, b) => a + b, 0)).toBe(KILLS_PER_LANE * LANES);
    console.info(`atomic save: ${KILLS_PER_LANE * LANES} SIGKILLs survived; ${strayTempFiles} kills landed mid-write (temporary file left behind)`);
  }, 60_000 + KILLS_PER_LANE * LANES * 1_000);
});

/**
 * Rules about the code itself, checked on the source and the bundle: only main/shell and the
 * preload import 'electron'; nothing hands a URL to shell.openExternal (Electron security
 * checklist #15); the preload bundles to one CommonJS file that requires only 'electron'
 * (sandboxed preloads can require nothing else — Electron docs, "Process Sandboxing").
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { build } from 'esbuild';
import { describe, expect, it } from 'vitest';
import { item } from './checklist';

const root = resolve(import.meta.dirname, '../..');

function sources(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const full = join(dir, name);
    if (statSync(full).isDirectory()) out.push(...sources(full));
    else if (/\.(ts|tsx|mts|cts)$/.test(name) && !name.endsWith('.d.ts')) out.push(full);
  }
  return out;
}

const appSources = [...sources(resolve(root, 'main')), ...sources(resolve(root, 'renderer'))].map((f) => relative(root, f).split('\\').join('/'));
const importsElectron = /(?:from\s+|import\s*\(\s*|require\s*\(\s*)['"]electron(?:\/[^'"]*)?['"]/;

describe('source rules', () => {
  it("only main/shell and main/preload.ts import 'electron' (at run time or for types)", () => {
    const offenders = appSources.filter((f) => importsElectron.test(readFileSync(resolve(root, f), 'utf8')) && !f.startsWith('main/shell/') && f !== 'main/preload.ts');
    expect(offenders).toEqual([]);
    // The check above can see an import: the shell really has them.
    expect(appSources.filter((f) => importsElectron.test(readFileSync(resolve(root, f), 'utf8')))).toEqual(expect.arrayContaining(['main/shell/index.ts', 'main/preload.ts']));
  });

  it(item(15, "no code calls openExternal or imports Electron's shell module"), () => {
    const importsShell = /import\s*\{[^}]*\bshell\b[^}]*\}\s*from\s*['"]electron['"]/;
    const callsOpenExternal = /\bopenExternal\s*\(/;
    const offenders = appSources.filter((f) => {
      const text = readFileSync(resolve(root, f), 'utf8');
      return importsShell.test(text) || callsOpenExternal.test(text);
    });
    expect(offenders).toEqual([]);
    // The patterns do match what they look for.
    expect(importsShell.test("import { app, shell } from 'electron';")).toBe(true);
    expect(callsOpenExternal.test('void shell.openExternal (url)')).toBe(true);
  });

  it('the preload bundles to one CommonJS file whose only require is electron', async () => {
    const result = await build({
      entryPoints: [resolve(root, 'main/preload.ts')],
      bundle: true,
      platform: 'node',
      format: 'cjs',
      external: ['electron'],
      write: false,
      logLevel: 'silent',
    });
    expect(result.outputFiles).toHaveLength(1);
    const code = result.outputFiles[0]?.text ?? '';
    const required = [...code.matchAll(/require\(["']([^"']+)["']\)/g)].map((m) => m[1]);
    expect(required).toEqual(['electron']);
    // No validation library or service code rides along into the sandbox.
    expect(code).not.toMatch(/zod|node:fs|writeFileAtomic/);
  });
});

/**
 * The IPC table: every DesktopBridge method has a name, a channel, an argument schema and a
 * handler; dispatch refuses unknown names, bad payloads (saying where) and hides stack traces.
 * Services are replaced by a recorder here — this file tests the wiring; services.test.ts runs
 * real calls against temp folders.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';
import type { Result } from '../../renderer/bridge/contract';
import { layout, project } from './fixtures';
// Imported file by file (not through main/ipc/index) so the wiring is tested without the services.
import { argNames, argSchemas } from '../../main/ipc/argSchemas';
import { bridgeMethods, channelFor, isBridgeMethod } from '../../main/ipc/channels';
import { dispatchBridgeCall } from '../../main/ipc/dispatch';
import { createHandlersFrom, type BridgeDeps, type BridgeServices } from '../../main/ipc/handlers';

const root = resolve(import.meta.dirname, '../..');

/** Method names of `interface DesktopBridge`, read from the contract's source with the TS parser. */
function contractMethods(): string[] {
  const file = resolve(root, 'renderer/bridge/contract.ts');
  const source = ts.createSourceFile(file, readFileSync(file, 'utf8'), ts.ScriptTarget.Latest, true);
  const names: string[] = [];
  source.forEachChild((node) => {
    if (ts.isInterfaceDeclaration(node) && node.name.text === 'DesktopBridge') {
      for (const member of node.members) {
        if (ts.isMethodSignature(member) && ts.isIdentifier(member.name)) names.push(member.name.text);
      }
    }
  });
  return names;
}

/** Members the preload adds itself (shell extras); not served by main/services. */
const shellOnly = new Set(['onMenuCommand', 'pathForFile', 'setDirty']);

const abs = process.platform === 'win32' ? 'C:\\data\\marks.xlsx' : '/data/marks.xlsx';

/** A valid argument list for each method, so the wiring test can call every one. */
const validArgs: { [M in (typeof bridgeMethods)[number]]: unknown[] } = {
  chooseOpenPath: ['spreadsheet'],
  chooseSavePath: ['project', 'Course.json'],
  previewSpreadsheet: [abs],
  importSpreadsheet: [abs, layout],
  previewMerge: [project, abs, layout],
  loadProject: [abs],
  saveProject: [abs, project],
  exportFinals: [{ path: abs, format: 'csv', project, columns: [{ field: 'id', header: 'ID' }], include: { breakdown: false, sectionStatistics: false, assessmentStatistics: false }, overwrite: false }],
  writeRecovery: [null, JSON.stringify(project)],
  readRecovery: [],
  discardRecovery: [],
  recentFiles: [],
  demoCourse: [],
};

/** Services that record which one was called with what, and answer ok(<name>). */
function recordingServices(): { services: BridgeServices; calls: { name: string; args: unknown[] }[] } {
  const calls: { name: string; args: unknown[] }[] = [];
  const answer = (name: string) => async (...args: unknown[]): Promise<Result<never>> => {
    calls.push({ name, args });
    return { ok: true, value: (name === 'saveProject' ? { path: args[0], savedAt: 'now' } : name) as never };
  };
  const names = [...bridgeMethods.filter((m) => m !== 'chooseOpenPath' && m !== 'chooseSavePath'), 'addRecentFile'];
  const services = Object.fromEntries(names.map((n) => [n, answer(n)])) as unknown as BridgeServices;
  return { services, calls };
}

describe('bridgeMethods', () => {
  it('lists exactly the service methods of DesktopBridge in contract.ts (read from its source)', () => {
    const fromContract = contractMethods().filter((m) => !shellOnly.has(m));
    expect(fromContract.length).toBeGreaterThan(0);
    expect([...bridgeMethods].sort()).toEqual(fromContract.sort());
  });

  it('gives each method one distinct wb: channel', () => {
    const channels = bridgeMethods.map(channelFor);
    expect(channelFor('previewSpreadsheet')).toBe('wb:previewSpreadsheet');
    expect(new Set(channels).size).toBe(bridgeMethods.length);
  });

  it('has an argument schema and argument names for every method', () => {
    for (const m of bridgeMethods) {
      expect(argSchemas[m], m).toBeDefined();
      expect(argNames[m], m).toBeDefined();
      expect(argSchemas[m].safeParse(validArgs[m]).success, m).toBe(true);
    }
  });

  it('does not take prototype keys for methods', () => {
    for (const name of ['constructor', '__proto__', 'toString', 'hasOwnProperty', 'hasNativeDialogs']) {
      expect(isBridgeMethod(name), name).toBe(false);
    }
  });
});

describe('createHandlersFrom', () => {
  const deps = (over: Partial<BridgeDeps> = {}): BridgeDeps => ({ userDataDir: '/tmp/unused', dialogs: null, ...over });

  it('wires every method: dispatch reaches the service of the same name with the same arguments', async () => {
    const { services, calls } = recordingServices();
    const handlers = createHandlersFrom(services, deps({ dialogs: { chooseOpenPath: async () => '/picked', chooseSavePath: async () => null } }));
    expect(Object.keys(handlers).sort()).toEqual([...bridgeMethods].sort());
    for (const m of bridgeMethods) {
      calls.length = 0;
      const result = await dispatchBridgeCall(handlers, m, validArgs[m]);
      expect(result.ok, m).toBe(true);
      if (m === 'chooseOpenPath' || m === 'chooseSavePath') continue;
      expect(calls[0]?.name, m).toBe(m);
      // Optional trailing arguments the caller left out arrive as undefined, not shifted.
      expect(calls[0]?.args.slice(0, validArgs[m].length), m).toEqual(validArgs[m]);
    }
  });

  it('records an opened spreadsheet, an opened project and a saved project in recent files', async () => {
    const { services, calls } = recordingServices();
    const seen: (readonly string[])[] = [];
    const handlers = createHandlersFrom(services, deps({ onRecentFilesChanged: (p) => seen.push(p) }));
    for (const m of ['previewSpreadsheet', 'loadProject', 'saveProject'] as const) {
      calls.length = 0;
      await dispatchBridgeCall(handlers, m, validArgs[m]);
      expect(calls.map((c) => c.name), m).toEqual([m, 'addRecentFile']);
      expect(calls[1]?.args, m).toEqual([abs]);
    }
    expect(seen).toHaveLength(3);
    calls.length = 0;
    await dispatchBridgeCall(handlers, 'importSpreadsheet', validArgs.importSpreadsheet);
    expect(calls.map((c) => c.name)).toEqual(['importSpreadsheet']);
  });

  it('does not record a file whose open failed', async () => {
    const { services, calls } = recordingServices();
    const failing: BridgeServices = { ...services, loadProject: async () => ({ ok: false, code: 'not-found', message: 'gone' }) };
    const handlers = createHandlersFrom(failing, deps());
    const result = await dispatchBridgeCall(handlers, 'loadProject', [abs]);
    expect(result).toMatchObject({ ok: false, code: 'not-found' });
    expect(calls.map((c) => c.name)).not.toContain('addRecentFile');
  });

  it('answers dialog calls with no-dialogs in the browser harness (dialogs null)', async () => {
    const handlers = createHandlersFrom(recordingServices().services, deps());
    expect(await dispatchBridgeCall(handlers, 'chooseOpenPath', ['project'])).toMatchObject({ ok: false, code: 'no-dialogs' });
    expect(await dispatchBridgeCall(handlers, 'chooseSavePath', ['export', 'finals.csv'])).toMatchObject({ ok: false, code: 'no-dialogs' });
  });

  it('passes the dialog choice through, including a cancel (null)', async () => {
    const asked: unknown[] = [];
    const handlers = createHandlersFrom(recordingServices().services, deps({
      dialogs: {
        chooseOpenPath: async (kind) => { asked.push(kind); return null; },
        chooseSavePath: async (kind, name) => { asked.push([kind, name]); return '/out/finals.csv'; },
      },
    }));
    expect(await dispatchBridgeCall(handlers, 'chooseOpenPath', ['spreadsheet'])).toEqual({ ok: true, value: null });
    expect(await dispatchBridgeCall(handlers, 'chooseSavePath', ['export', 'finals.csv'])).toEqual({ ok: true, value: '/out/finals.csv' });
    expect(asked).toEqual(['spreadsheet', ['export', 'finals.csv']]);
  });
});

describe('dispatchBridgeCall refusals', () => {
  const { services, calls } = recordingServices();
  const handlers = createHandlersFrom(services, { userDataDir: '/tmp/unused', dialogs: null });

  it('refuses an unknown method without calling anything', async () => {
    for (const name of ['deleteEverything', 'constructor', '__proto__', 'wb:loadProject', '']) {
      const result = await dispatchBridgeCall(handlers, name, []);
      expect(result, name).toMatchObject({ ok: false, code: 'unknown-method' });
    }
    expect(calls).toHaveLength(0);
  });

  it('refuses arguments that are not a list', async () => {
    expect(await dispatchBridgeCall(handlers, 'loadProject', { 0: abs })).toMatchObject({ ok: false, code: 'bad-payload' });
    expect(await dispatchBridgeCall(handlers, 'loadProject', abs)).toMatchObject({ ok: false, code: 'bad-payload' });
  });

  it('refuses a relative path, naming the argument', async () => {
    const result = await dispatchBridgeCall(handlers, 'loadProject', ['../../etc/passwd']);
    expect(result.ok).toBe(false);
    if (!result.ok) {
      expect(result.code).toBe('bad-payload');
      expect(result.message).toMatch(/^The request loadProject was refused: path: Give the full \(absolute\) path/);
    }
  });

  it('refuses a path with a NUL byte', async () => {
    const result = await dispatchBridgeCall(handlers, 'previewSpreadsheet', [`${abs}\0.png`]);
    expect(result).toMatchObject({ ok: false, code: 'bad-payload' });
  });

  it('locates a bad field deep in a payload by argument name and zod path', async () => {
    const bad = { ...layout, sheets: [{ ...layout.sheets[0], headerRow: -1 }] };
    const result = await dispatchBridgeCall(handlers, 'importSpreadsheet', [abs, bad]);
    expect(result.ok).toBe(false);
    if (!result.ok) {
      expect(result.code).toBe('bad-payload');
      expect(result.message).toContain('layout.sheets[0].headerRow:');
    }
    const badScore = { ...project, gradebook: { ...project.gradebook, scores: [[{ kind: 'earned', points: 'seven' }]] } };
    const saved = await dispatchBridgeCall(handlers, 'saveProject', [abs, badScore]);
    expect(saved.ok ? '' : saved.message).toContain('project.gradebook.scores[0][0]');
  });

  it('refuses unknown keys (strict objects) and extra or missing arguments', async () => {
    const extraKey = await dispatchBridgeCall(handlers, 'previewSpreadsheet', [abs, { encoding: 'utf-8', evil: true }]);
    expect(extraKey).toMatchObject({ ok: false, code: 'bad-payload' });
    expect(await dispatchBridgeCall(handlers, 'loadProject', [abs, 'extra'])).toMatchObject({ ok: false, code: 'bad-payload' });
    expect(await dispatchBridgeCall(handlers, 'saveProject', [abs])).toMatchObject({ ok: false, code: 'bad-payload' });
    expect(await dispatchBridgeCall(handlers, 'chooseOpenPath', ['passwords'])).toMatchObject({ ok: false, code: 'bad-payload' });
    expect(calls).toHaveLength(0);
  });

  it('turns a thrown error into an internal failure with the message and no stack', async () => {
    const boom: BridgeServices = { ...services, recentFiles: async () => { throw new Error('disk on fire'); } };
    const result = await dispatchBridgeCall(createHandlersFrom(boom, { userDataDir: '/x', dialogs: null }), 'recentFiles', []);
    expect(result).toEqual({ ok: false, code: 'internal', message: 'recentFiles failed: disk on fire' });
    const thrownString: BridgeServices = { ...services, demoCourse: () => Promise.reject('not an Error') };
    const other = await dispatchBridgeCall(createHandlersFrom(thrownString, { userDataDir: '/x', dialogs: null }), 'demoCourse', []);
    expect(other).toMatchObject({ ok: false, code: 'internal' });
    expect(JSON.stringify(other)).not.toMatch(/at .*\.ts:\d+/);
  });
});

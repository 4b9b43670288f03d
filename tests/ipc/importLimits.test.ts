// Import limits sent with each request (ImportLimitsRequest): the size limit on both the direct
// reading (browser harness) and the isolated one (worker thread), refusals of bad values, and the
// renderer's defaults kept equal to main's. The demo workbook's size is read from disk, not typed in.
import { mkdtemp, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dispatchBridgeCall, type BridgeHandlers } from '../../main/ipc/dispatch';
import { createBridgeHandlers } from '../../main/ipc/services';
import { DEFAULT_IMPORT_LIMITS, limitsFromRequest } from '../../main/services/untrusted';
import type { CourseProject, ImportLayout, Result } from '../../renderer/bridge/contract';
import { DEFAULT_IMPORT_LIMITS_REQUEST, MAX_IMPORT_LIMITS_REQUEST } from '../../renderer/bridge/importLimits';

const root = fileURLToPath(new URL('../..', import.meta.url));
const demo = join(root, 'demo-data', 'glaciology-231.xlsx');
const MB = 1024 * 1024;
let dir = '';
let demoMegabytes = 0;
let layout: ImportLayout;
let project: CourseProject;
let paths: { name: string; handlers: BridgeHandlers }[] = [];

function value<T>(r: Result<unknown>): T {
  if (!r.ok) throw new Error(`${r.code}: ${r.message}`);
  return r.value as T;
}

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'wb-limits-ipc-'));
  demoMegabytes = (await stat(demo)).size / MB;
  paths = [
    { name: 'direct', handlers: createBridgeHandlers({ userDataDir: join(dir, 'direct'), dialogs: null, appRoot: root }) },
    { name: 'isolated', handlers: createBridgeHandlers({ userDataDir: join(dir, 'isolated'), dialogs: null, appRoot: root, isolateImports: true }) },
  ];
  const direct = paths[0]!.handlers;
  layout = value<{ detected: ImportLayout }>(await dispatchBridgeCall(direct, 'previewSpreadsheet', [demo])).detected;
  project = value<CourseProject>(await dispatchBridgeCall(direct, 'demoCourse', []));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('import limits from the window', { timeout: 120_000 }, () => {
  it('the renderer starts with the limits main uses by default', () => {
    expect(limitsFromRequest(DEFAULT_IMPORT_LIMITS_REQUEST, undefined)).toEqual({
      maxBytes: DEFAULT_IMPORT_LIMITS.maxBytes,
      maxMillis: DEFAULT_IMPORT_LIMITS.maxMillis,
    });
  });

  it('converts binary megabytes and seconds, over the process limits, keeping what the request leaves out', () => {
    expect(limitsFromRequest({ maxMegabytes: 0.5, maxSeconds: 2.5 }, { maxBytes: 10, maxHeapMb: 64 })).toEqual({ maxBytes: 512 * 1024, maxMillis: 2500, maxHeapMb: 64 });
    expect(limitsFromRequest({}, { maxBytes: 10 })).toEqual({ maxBytes: 10 });
    expect(limitsFromRequest(undefined, undefined)).toEqual({});
  });

  for (const which of ['direct', 'isolated'] as const) {
    it(`${which}: a size limit below the file refuses preview, dry run and merge as too-large; a larger one reads it`, async () => {
      const handlers = paths.find((p) => p.name === which)!.handlers;
      const small = { maxMegabytes: demoMegabytes / 2 };
      const calls = [
        ['previewSpreadsheet', [demo, { limits: small }]],
        ['importSpreadsheet', [demo, layout, small]],
        ['previewMerge', [project, demo, layout, small]],
      ] as const;
      for (const [method, args] of calls) {
        const r = await dispatchBridgeCall(handlers, method, args);
        expect(r, method).toMatchObject({ ok: false, code: 'too-large' });
        if (!r.ok) expect(r.message, method).toContain('glaciology-231.xlsx');
        if (!r.ok) expect(r.message, method).toContain('raise the size limit');
      }
      const large = { maxMegabytes: demoMegabytes * 2 };
      const unlimited = await dispatchBridgeCall(handlers, 'previewSpreadsheet', [demo]);
      expect(await dispatchBridgeCall(handlers, 'previewSpreadsheet', [demo, { limits: large }])).toEqual(unlimited);
      expect((await dispatchBridgeCall(handlers, 'importSpreadsheet', [demo, layout, large])).ok).toBe(true);
      expect((await dispatchBridgeCall(handlers, 'previewMerge', [project, demo, layout, large])).ok).toBe(true);
    });
  }

  it('the direct and the isolated reading refuse an oversized file in the same words', async () => {
    const args = [demo, { limits: { maxMegabytes: demoMegabytes / 2 } }];
    const [a, b] = await Promise.all(paths.map((p) => dispatchBridgeCall(p.handlers, 'previewSpreadsheet', args)));
    expect(a).toEqual(b);
  });

  it('a request may raise a limit the process set lower', async () => {
    const low = createBridgeHandlers({ userDataDir: join(dir, 'low'), dialogs: null, appRoot: root, isolateImports: true, importLimits: { maxBytes: 1024 } });
    expect(await dispatchBridgeCall(low, 'previewSpreadsheet', [demo])).toMatchObject({ ok: false, code: 'too-large' });
    expect((await dispatchBridgeCall(low, 'previewSpreadsheet', [demo, { limits: { maxMegabytes: demoMegabytes * 2 } }])).ok).toBe(true);
  });

  it('refuses limits that are not positive numbers within the maxima as bad-payload, before reading', async () => {
    const handlers = paths[0]!.handlers;
    const bad: unknown[] = [
      { maxMegabytes: 0 },
      { maxMegabytes: -1 },
      { maxMegabytes: Number.NaN },
      { maxMegabytes: Number.POSITIVE_INFINITY },
      { maxMegabytes: MAX_IMPORT_LIMITS_REQUEST.maxMegabytes + 1 },
      { maxMegabytes: '5' },
      { maxSeconds: 0 },
      { maxSeconds: MAX_IMPORT_LIMITS_REQUEST.maxSeconds + 1 },
      { maxBytes: 10 },
      null,
    ];
    for (const limits of bad) {
      const label = JSON.stringify(limits);
      expect(await dispatchBridgeCall(handlers, 'previewSpreadsheet', [demo, { limits }]), label).toMatchObject({ ok: false, code: 'bad-payload' });
      expect(await dispatchBridgeCall(handlers, 'importSpreadsheet', [demo, layout, limits]), label).toMatchObject({ ok: false, code: 'bad-payload' });
      expect(await dispatchBridgeCall(handlers, 'previewMerge', [project, demo, layout, limits]), label).toMatchObject({ ok: false, code: 'bad-payload' });
    }
    const refused = await dispatchBridgeCall(handlers, 'importSpreadsheet', [demo, layout, { maxSeconds: 0 }]);
    expect(refused.ok).toBe(false);
    expect(refused.ok ? '' : refused.message).toContain('limits.maxSeconds');
  });
});

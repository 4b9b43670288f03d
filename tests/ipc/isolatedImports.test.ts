// With `isolateImports` (set by the Electron shell) the bridge parses spreadsheets in a worker
// thread (main/services/untrusted); the answers must be the same as the direct reading.
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dispatchBridgeCall } from '../../main/ipc/dispatch';
import { createBridgeHandlers } from '../../main/ipc/services';

const root = fileURLToPath(new URL('../..', import.meta.url));
const demo = join(root, 'demo-data', 'glaciology-231.xlsx');
let dir = '';

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'wb-isolated-ipc-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('bridge with isolated imports', { timeout: 120_000 }, () => {
  it('previews and imports the demo workbook exactly as the direct reading does', async () => {
    const direct = createBridgeHandlers({ userDataDir: join(dir, 'direct'), dialogs: null, appRoot: root });
    const isolated = createBridgeHandlers({ userDataDir: join(dir, 'isolated'), dialogs: null, appRoot: root, isolateImports: true });
    const a = await dispatchBridgeCall(direct, 'previewSpreadsheet', [demo]);
    const b = await dispatchBridgeCall(isolated, 'previewSpreadsheet', [demo]);
    expect(a.ok).toBe(true);
    expect(b).toEqual(a);
    if (!a.ok) return;
    const layout = (a.value as { detected: unknown }).detected;
    const ia = await dispatchBridgeCall(direct, 'importSpreadsheet', [demo, layout]);
    const ib = await dispatchBridgeCall(isolated, 'importSpreadsheet', [demo, layout]);
    expect(ia.ok).toBe(true);
    expect(ib).toEqual(ia);
  });

  it('refuses a file over the size limit without parsing it', async () => {
    const isolated = createBridgeHandlers({ userDataDir: join(dir, 'small'), dialogs: null, appRoot: root, isolateImports: true, importLimits: { maxBytes: 1024 } });
    const r = await dispatchBridgeCall(isolated, 'previewSpreadsheet', [demo]);
    expect(r).toMatchObject({ ok: false, code: 'too-large' });
  });
});

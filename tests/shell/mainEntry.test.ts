/**
 * The main entry (main/shell/index.ts) with 'electron' replaced by a recorder — the binary cannot
 * run here, so this is the boundary the mock sits on; everything behind it (IPC table, services,
 * guards) is real. Checks that importing the entry wires every DesktopBridge method to an
 * ipcMain handler, applies the guards, and opens the window the secure way.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { bridgeMethods, channelFor, shellChannels } from '../../main/ipc/channels';
import { denyPermissionCheck, denyPermissionRequest, denyWindowOpen } from '../../main/shell/guards';
import { webPreferences } from '../../main/shell/windowOptions';
import { item } from './checklist';

type Listener = (...args: unknown[]) => unknown;

const rec = vi.hoisted(() => {
  const calls: string[] = [];
  const state = {
    userData: '',
    ipcHandlers: new Map<string, Listener>(),
    appListeners: new Map<string, Listener>(),
    protocolHandlers: new Map<string, Listener>(),
    privileged: [] as unknown[],
    windows: [] as { options: Record<string, unknown>; urls: string[] }[],
    permissionRequest: null as unknown,
    permissionCheck: null as unknown,
    menus: 0,
  };
  class FakeContents {
    id = 1;
    on() { return this; }
    once() { return this; }
    send() {}
    reload() {}
  }
  class FakeWindow {
    webContents = new FakeContents();
    record: { options: Record<string, unknown>; urls: string[] };
    constructor(options: Record<string, unknown>) {
      calls.push('new BrowserWindow');
      this.record = { options, urls: [] };
      state.windows.push(this.record);
    }
    once() { return this; }
    on() { return this; }
    async loadURL(url: string) { this.record.urls.push(url); }
    show() {}
  }
  const module = {
    app: {
      enableSandbox: () => calls.push('enableSandbox'),
      requestSingleInstanceLock: () => { calls.push('requestSingleInstanceLock'); return true; },
      on: (event: string, listener: Listener) => { state.appListeners.set(event, listener); },
      whenReady: () => { calls.push('whenReady'); return Promise.resolve(); },
      getPath: () => state.userData,
      getAppPath: () => process.cwd(),
      getVersion: () => '0.0.0-test',
      isPackaged: false,
      quit: () => calls.push('quit'),
    },
    BrowserWindow: FakeWindow,
    dialog: { showOpenDialog: async () => ({ canceled: true, filePaths: [] }), showSaveDialog: async () => ({ canceled: true }), showMessageBox: async () => ({ response: 2 }), showErrorBox: () => undefined },
    ipcMain: { handle: (channel: string, listener: Listener) => { state.ipcHandlers.set(channel, listener); } },
    Menu: { buildFromTemplate: (t: unknown) => t, setApplicationMenu: () => { state.menus += 1; } },
    protocol: {
      registerSchemesAsPrivileged: (schemes: unknown[]) => { calls.push('registerSchemesAsPrivileged'); state.privileged.push(...schemes); },
      handle: (scheme: string, handler: Listener) => { calls.push(`protocol.handle ${scheme}`); state.protocolHandlers.set(scheme, handler); },
    },
    session: {
      defaultSession: {
        setPermissionRequestHandler: (h: unknown) => { state.permissionRequest = h; },
        setPermissionCheckHandler: (h: unknown) => { state.permissionCheck = h; },
      },
    },
  };
  return { calls, state, module };
});

vi.mock('electron', () => rec.module);

const trustedEvent = { senderFrame: { url: 'app://weighbridge/index.html', parent: null }, sender: { id: 1 } };

beforeAll(async () => {
  rec.state.userData = mkdtempSync(join(tmpdir(), 'wb-userdata-'));
  await import('../../main/shell/index');
  // Let app.whenReady().then(…) run to the window.
  await vi.waitFor(() => expect(rec.state.windows).toHaveLength(1));
});

afterAll(() => rmSync(rec.state.userData, { recursive: true, force: true }));

describe('main entry', () => {
  it('registers an ipcMain.handle for every DesktopBridge method (and the shell channels)', () => {
    const expected = [...bridgeMethods.map((m) => channelFor(m)), shellChannels.setDirty, shellChannels.printReportToPdf].sort();
    expect([...rec.state.ipcHandlers.keys()].sort()).toEqual(expected);
  });

  it(item(4, 'enables the sandbox for every renderer before the app is ready'), () => {
    expect(rec.calls.indexOf('enableSandbox')).toBeGreaterThanOrEqual(0);
    expect(rec.calls.indexOf('enableSandbox')).toBeLessThan(rec.calls.indexOf('whenReady'));
  });

  it(item(18, 'registers app:// as a standard secure scheme before ready, serves it, and refuses file://'), async () => {
    expect(rec.state.privileged).toEqual([{ scheme: 'app', privileges: { standard: true, secure: true, supportFetchAPI: true } }]);
    expect(rec.calls.indexOf('registerSchemesAsPrivileged')).toBeLessThan(rec.calls.indexOf('whenReady'));
    expect([...rec.state.protocolHandlers.keys()].sort()).toEqual(['app', 'file']);
    const fileAnswer = (await rec.state.protocolHandlers.get('file')?.(new Request('file:///etc/passwd'))) as Response;
    expect(fileAnswer.status).toBe(403);
  });

  it(item(5, 'sets the deny-all permission request and check handlers on the session'), () => {
    expect(rec.state.permissionRequest).toBe(denyPermissionRequest);
    expect(rec.state.permissionCheck).toBe(denyPermissionCheck);
  });

  it('takes the single-instance lock and opens one window with the secure options at app://weighbridge/index.html', () => {
    expect(rec.calls).toContain('requestSingleInstanceLock');
    const [win] = rec.state.windows;
    const prefs = win?.options.webPreferences as { preload: string };
    expect(prefs.preload).toMatch(/preload\.cjs$/);
    expect(prefs).toEqual(webPreferences(prefs.preload));
    expect(win?.urls).toEqual(['app://weighbridge/index.html']);
    expect(rec.state.menus).toBeGreaterThanOrEqual(1);
  });

  it(item(14, 'guards every webContents created (web-contents-created)'), () => {
    const listener = rec.state.appListeners.get('web-contents-created');
    expect(listener).toBeDefined();
    const events: string[] = [];
    let openHandler: unknown = null;
    const contents = { on: (e: string) => { events.push(e); return contents; }, setWindowOpenHandler: (h: unknown) => { openHandler = h; } };
    listener?.({}, contents);
    expect(events).toEqual(expect.arrayContaining(['will-navigate', 'will-frame-navigate', 'will-redirect', 'will-attach-webview']));
    expect(openHandler).toBe(denyWindowOpen);
  });

  it(item(17, 'a registered handler runs a real service call for the app page and refuses others'), async () => {
    const recent = rec.state.ipcHandlers.get('wb:recentFiles');
    expect(await recent?.(trustedEvent)).toEqual({ ok: true, value: [] });
    expect(await recent?.({ senderFrame: { url: 'file:///index.html', parent: null }, sender: { id: 1 } })).toMatchObject({ ok: false, code: 'untrusted-sender' });
    const recovery = rec.state.ipcHandlers.get('wb:readRecovery');
    expect(await recovery?.(trustedEvent)).toEqual({ ok: true, value: null });
  });
});

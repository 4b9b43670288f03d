/**
 * The preload exposes exactly the bridge methods (plus the shell extras) and never ipcRenderer
 * (Electron security checklist #20 "Do not expose Electron APIs to untrusted web content"; #3
 * context isolation is what makes contextBridge the only way across). 'electron' is mocked here
 * only because its binary cannot run on this machine.
 */
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { bridgeMethods, channelFor, shellChannels, type MenuCommand, type PreloadApi } from '../../main/ipc/channels';
import { item } from './checklist';

const electron = vi.hoisted(() => {
  const exposed: { key: string; api: unknown }[] = [];
  const onListeners = new Map<string, (event: unknown, ...args: unknown[]) => void>();
  const invoke = vi.fn(async (..._args: unknown[]) => ({ ok: true, value: 'answered' }));
  return {
    exposed,
    onListeners,
    invoke,
    module: {
      contextBridge: { exposeInMainWorld: (key: string, api: unknown) => exposed.push({ key, api }) },
      ipcRenderer: {
        invoke,
        on: (channel: string, listener: (event: unknown, ...args: unknown[]) => void) => onListeners.set(channel, listener),
        send: vi.fn(),
      },
      webUtils: { getPathForFile: (file: { name: string }) => `/dropped/${file.name}` },
    },
  };
});

vi.mock('electron', () => electron.module);

let api: PreloadApi;

beforeAll(async () => {
  await import('../../main/preload');
  expect(electron.exposed).toHaveLength(1);
  expect(electron.exposed[0]?.key).toBe('weighbridge');
  api = electron.exposed[0]?.api as PreloadApi;
});

describe('preload', () => {
  it(item(20, 'exposes exactly the bridge methods, hasNativeDialogs and the four shell extras'), () => {
    expect(Object.keys(api).sort()).toEqual([...bridgeMethods, 'hasNativeDialogs', 'onMenuCommand', 'pathForFile', 'setDirty', 'printReportToPdf'].sort());
    expect(api.hasNativeDialogs).toBe(true);
  });

  it(item(20, 'never exposes ipcRenderer, nor any of its functions'), () => {
    const values = Object.values(api);
    expect(values).not.toContain(electron.module.ipcRenderer);
    for (const fn of [electron.module.ipcRenderer.invoke, electron.module.ipcRenderer.on, electron.module.ipcRenderer.send]) {
      expect(values).not.toContain(fn);
    }
    expect(Object.keys(api)).not.toEqual(expect.arrayContaining(['invoke']));
    expect(Object.keys(api).some((k) => /ipc|invoke|send|require/i.test(k))).toBe(false);
  });

  it('sends each method on its own channel with the arguments as given', async () => {
    for (const method of bridgeMethods) {
      electron.invoke.mockClear();
      const fn = (api as unknown as Record<string, (...a: unknown[]) => Promise<unknown>>)[method];
      expect(await fn?.('/a/b.xlsx', 2), method).toEqual({ ok: true, value: 'answered' });
      expect(electron.invoke.mock.calls, method).toEqual([[channelFor(method), '/a/b.xlsx', 2]]);
    }
  });

  it('reports the dirty flag on wb:setDirty as a boolean', async () => {
    electron.invoke.mockClear();
    await api.setDirty(true);
    expect(electron.invoke.mock.calls).toEqual([[shellChannels.setDirty, true]]);
  });

  it('sends the report page and path on wb:printReportToPdf', async () => {
    electron.invoke.mockClear();
    await api.printReportToPdf('<p>r</p>', '/tmp/r.pdf');
    expect(electron.invoke.mock.calls).toEqual([[shellChannels.printReportToPdf, '<p>r</p>', '/tmp/r.pdf']]);
  });

  it('gives the path of a dropped file through webUtils', () => {
    expect(api.pathForFile({ name: 'marks.xlsx' } as File)).toBe('/dropped/marks.xlsx');
  });

  it('queues menu commands until a listener subscribes, then delivers in order; unsubscribing stops them', () => {
    const relay = electron.onListeners.get(shellChannels.command);
    expect(relay).toBeDefined();
    relay?.({}, 'save');
    relay?.({}, { kind: 'open-recent', path: '/x.weighbridge' });
    const got: MenuCommand[] = [];
    const off = api.onMenuCommand((c) => got.push(c));
    expect(got).toEqual(['save', { kind: 'open-recent', path: '/x.weighbridge' }]);
    relay?.({}, 'undo');
    expect(got).toHaveLength(3);
    off();
    relay?.({}, 'redo');
    expect(got).toHaveLength(3);
  });
});

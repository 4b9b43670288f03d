/**
 * Navigation, new-window, webview, permission and IPC-sender guards (Electron "Security" tutorial
 * checklist; see checklist.ts). The handlers are called directly with Electron-shaped arguments.
 */
import { describe, expect, it } from 'vitest';
import type { HandlerDetails, IpcMainInvokeEvent, WindowOpenHandlerResponse } from 'electron';
import type { Result } from '../../renderer/bridge/contract';
import { bridgeMethods, channelFor, shellChannels } from '../../main/ipc/channels';
import type { BridgeHandlers } from '../../main/ipc/dispatch';
import { isAppUrl } from '../../main/shell/appUrl';
import {
  denyPermissionCheck,
  denyPermissionRequest,
  denyWindowOpen,
  guardContents,
  isNavigationAllowed,
  isTrustedSender,
  type GuardableContents,
} from '../../main/shell/guards';
import { handleBridgeInvoke, registerIpc, type IpcMainLike } from '../../main/shell/registerIpc';
import { item } from './checklist';

const top = { url: 'app://weighbridge/index.html', parent: null };

describe('isTrustedSender', () => {
  it(item(17, 'accepts the top frame of the app page'), () => {
    expect(isTrustedSender(top)).toBe(true);
    expect(isTrustedSender({ url: 'app://weighbridge/index.html#/results', parent: null })).toBe(true);
  });

  it(item(17, 'refuses a sub-frame even of the app origin'), () => {
    expect(isTrustedSender({ url: 'app://weighbridge/index.html', parent: top as never })).toBe(false);
  });

  it(item(17, 'refuses file://, web pages, look-alike hosts, a gone frame'), () => {
    for (const url of ['file:///app/dist/renderer/index.html', 'https://weighbridge/index.html', 'http://127.0.0.1:5173/', 'app://weighbridge.evil/index.html', 'app://evil/weighbridge', 'app://x@weighbridge/', 'data:text/html,hi', 'about:blank', '']) {
      expect(isTrustedSender({ url, parent: null }), url).toBe(false);
    }
    expect(isTrustedSender(null)).toBe(false);
    expect(isTrustedSender(undefined)).toBe(false);
  });
});

describe('navigation and new windows', () => {
  it(item(13, 'allows only in-app navigation'), () => {
    expect(isNavigationAllowed('app://weighbridge/index.html#roster')).toBe(true);
    for (const url of ['https://example.org/', 'http://127.0.0.1/', 'file:///etc/passwd', 'javascript:alert(1)', 'data:text/html,x', 'app://other/index.html', 'mailto:a@b.c']) {
      expect(isNavigationAllowed(url), url).toBe(false);
    }
  });

  it(item(14, 'denies every window.open'), () => {
    const details = { url: 'app://weighbridge/index.html', frameName: '', features: '', disposition: 'new-window', referrer: { url: '', policy: 'default' }, postBody: undefined } as unknown as HandlerDetails;
    expect(denyWindowOpen(details)).toEqual({ action: 'deny' });
  });

  it(item(13, 'guardContents prevents outside navigation, redirects, sub-frame navigation and webview attach; sets the window-open handler'), () => {
    const listeners = new Map<string, (event: { preventDefault(): void; url: string }) => void>();
    let openHandler: ((d: HandlerDetails) => WindowOpenHandlerResponse) | null = null;
    const contents = {
      on(event: string, listener: (event: { preventDefault(): void; url: string }) => void) {
        listeners.set(event, listener);
        return contents;
      },
      setWindowOpenHandler(handler: (d: HandlerDetails) => WindowOpenHandlerResponse) {
        openHandler = handler;
      },
    } as GuardableContents;
    guardContents(contents);
    expect([...listeners.keys()].sort()).toEqual(['will-attach-webview', 'will-frame-navigate', 'will-navigate', 'will-redirect']);
    const fire = (name: string, url: string): boolean => {
      let prevented = false;
      listeners.get(name)?.({ url, preventDefault: () => { prevented = true; } });
      return prevented;
    };
    for (const name of ['will-navigate', 'will-frame-navigate', 'will-redirect']) {
      expect(fire(name, 'https://example.org/'), name).toBe(true);
      expect(fire(name, 'file:///etc/passwd'), name).toBe(true);
      expect(fire(name, 'app://weighbridge/index.html'), name).toBe(false);
    }
    expect(fire('will-attach-webview', 'app://weighbridge/index.html')).toBe(true);
    expect(openHandler).toBe(denyWindowOpen);
  });
});

describe('permissions', () => {
  it(item(5, 'every permission request is answered no'), () => {
    for (const permission of ['media', 'geolocation', 'notifications', 'clipboard-read', 'openExternal', 'fileSystem', 'unknown']) {
      let answer: boolean | null = null;
      denyPermissionRequest({}, permission, (granted) => { answer = granted; });
      expect(answer, permission).toBe(false);
    }
    expect(denyPermissionCheck()).toBe(false);
  });
});

describe('app origin', () => {
  it('is app://weighbridge with no port or user info', () => {
    expect(isAppUrl('app://weighbridge/')).toBe(true);
    expect(isAppUrl('app://weighbridge:1/')).toBe(false);
    // Chromium lower-cases the host of a standard scheme, so a real frame URL is always lower case;
    // Node's parser keeps an opaque host's case, and the check does not guess: upper case is refused.
    expect(isAppUrl('app://WEIGHBRIDGE/')).toBe(false);
  });
});

describe('registerIpc', () => {
  function recorder(): { ipc: IpcMainLike; handlersByChannel: Map<string, (event: IpcMainInvokeEvent, ...args: unknown[]) => unknown> } {
    const handlersByChannel = new Map<string, (event: IpcMainInvokeEvent, ...args: unknown[]) => unknown>();
    return { ipc: { handle: (channel, listener) => { handlersByChannel.set(channel, listener); } }, handlersByChannel };
  }
  const calls: string[] = [];
  const handlers = Object.fromEntries(bridgeMethods.map((m) => [m, async () => { calls.push(m); return { ok: true, value: m }; }])) as unknown as BridgeHandlers;
  const noPrint = async () => ({ ok: false as const, code: 'unused', message: 'not called in this test' });
  const event = (url: string, parent: unknown = null, id = 7) => ({ senderFrame: { url, parent }, sender: { id } }) as unknown as IpcMainInvokeEvent;

  it('registers one ipcMain.handle for every bridge method plus the shell channels', () => {
    const { ipc, handlersByChannel } = recorder();
    const channels = registerIpc(ipc, handlers, { onSetDirty: () => undefined, printReportToPdf: noPrint });
    expect([...handlersByChannel.keys()].sort()).toEqual([...bridgeMethods.map(channelFor), shellChannels.setDirty, shellChannels.printReportToPdf].sort());
    expect(channels.sort()).toEqual([...handlersByChannel.keys()].sort());
  });

  it(item(17, 'runs a trusted call and refuses the same call from an untrusted frame'), async () => {
    const { ipc, handlersByChannel } = recorder();
    registerIpc(ipc, handlers, { onSetDirty: () => undefined, printReportToPdf: noPrint });
    calls.length = 0;
    const listener = handlersByChannel.get('wb:recentFiles');
    expect(await listener?.(event('app://weighbridge/index.html'))).toEqual({ ok: true, value: 'recentFiles' });
    expect(await listener?.(event('file:///x/index.html'))).toMatchObject({ ok: false, code: 'untrusted-sender' });
    expect(await listener?.(event('app://weighbridge/index.html', {}))).toMatchObject({ ok: false, code: 'untrusted-sender' });
    expect(calls).toEqual(['recentFiles']);
  });

  it('validates the payload after the sender (bad payload from the app is refused with its place)', async () => {
    const result = (await handleBridgeInvoke(handlers, 'loadProject', event('app://weighbridge/'), [42])) as Result<unknown>;
    expect(result).toMatchObject({ ok: false, code: 'bad-payload' });
    expect(result.ok ? '' : result.message).toContain('path:');
  });

  it('wb:setDirty takes exactly one boolean from a trusted sender', async () => {
    const { ipc, handlersByChannel } = recorder();
    const seen: [number, boolean][] = [];
    registerIpc(ipc, handlers, { onSetDirty: (id, dirty) => seen.push([id, dirty]), printReportToPdf: noPrint });
    const setDirty = handlersByChannel.get(shellChannels.setDirty);
    expect(await setDirty?.(event('app://weighbridge/index.html'), true)).toEqual({ ok: true, value: null });
    expect(await setDirty?.(event('app://weighbridge/index.html'), 'yes')).toMatchObject({ ok: false, code: 'bad-payload' });
    expect(await setDirty?.(event('https://evil.example/'), false)).toMatchObject({ ok: false, code: 'untrusted-sender' });
    expect(seen).toEqual([[7, true]]);
  });

  it('wb:printReportToPdf takes the page and an absolute path from a trusted sender only', async () => {
    const { ipc, handlersByChannel } = recorder();
    const printed: [string, string][] = [];
    registerIpc(ipc, handlers, {
      onSetDirty: () => undefined,
      printReportToPdf: async (html, path) => {
        printed.push([html, path]);
        return { ok: true, value: { path } };
      },
    });
    const print = handlersByChannel.get(shellChannels.printReportToPdf);
    const trusted = event('app://weighbridge/index.html');
    expect(await print?.(trusted, '<p>report</p>', '/tmp/r.pdf')).toEqual({ ok: true, value: { path: '/tmp/r.pdf' } });
    expect(await print?.(trusted, '<p>report</p>', 'r.pdf')).toMatchObject({ ok: false, code: 'bad-payload' });
    expect(await print?.(trusted, 42, '/tmp/r.pdf')).toMatchObject({ ok: false, code: 'bad-payload' });
    expect(await print?.(event('https://evil.example/'), '<p>x</p>', '/tmp/x.pdf')).toMatchObject({ ok: false, code: 'untrusted-sender' });
    expect(printed).toEqual([['<p>report</p>', '/tmp/r.pdf']]);
  });
});

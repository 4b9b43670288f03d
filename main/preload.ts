/**
 * The preload: the page's only door to the main process. It exposes one object,
 * `window.weighbridge`, built from the bridge's method list — one function per method, each an
 * `ipcRenderer.invoke` on that method's channel — plus the shell extras (menu commands, dropped
 * file paths, unsaved-changes flag). `ipcRenderer` itself is never exposed (Electron docs,
 * "Security" tutorial: do not expose raw Electron APIs to untrusted content).
 *
 * Runs sandboxed, so it may `require` only 'electron': it is bundled into one CommonJS file, and
 * imports nothing heavier than the channel list.
 */
import { contextBridge, ipcRenderer, webUtils } from 'electron';
import { bridgeMethods, channelFor, shellChannels, type MenuCommand, type PreloadApi } from './ipc/channels';

type Listener = (command: MenuCommand) => void;

/**
 * Menu commands can arrive before the page has subscribed (a file named on the command line is
 * sent as soon as the page loads), so they are queued until the first listener arrives.
 */
function createCommandRelay(): Pick<PreloadApi, 'onMenuCommand'> {
  const listeners = new Set<Listener>();
  const queued: MenuCommand[] = [];
  ipcRenderer.on(shellChannels.command, (_event: unknown, command: MenuCommand) => {
    if (listeners.size === 0) queued.push(command);
    else for (const listener of listeners) listener(command);
  });
  return {
    onMenuCommand(listener) {
      listeners.add(listener);
      for (const command of queued.splice(0)) listener(command);
      return () => {
        listeners.delete(listener);
      };
    },
  };
}

export function buildPreloadApi(): PreloadApi {
  const calls = Object.fromEntries(
    bridgeMethods.map((method) => {
      const channel = channelFor(method);
      // A fresh function per method: the page gets no handle on ipcRenderer or the channel names.
      return [method, (...args: unknown[]) => ipcRenderer.invoke(channel, ...args)];
    }),
  ) as Omit<PreloadApi, 'hasNativeDialogs' | 'onMenuCommand' | 'pathForFile' | 'setDirty' | 'printReportToPdf'>;
  return {
    ...calls,
    hasNativeDialogs: true,
    ...createCommandRelay(),
    pathForFile: (file) => webUtils.getPathForFile(file),
    setDirty: async (dirty) => {
      await ipcRenderer.invoke(shellChannels.setDirty, dirty === true);
    },
    printReportToPdf: (html, path) => ipcRenderer.invoke(shellChannels.printReportToPdf, html, path),
  };
}

contextBridge.exposeInMainWorld('weighbridge', buildPreloadApi());

/**
 * The Electron main process: lifecycle, window, protocol, menu, dialogs and the IPC bridge.
 * Thin on purpose — each decision lives in a pure module beside this one (windowOptions, csp,
 * protocol, guards, menu, lifecycle, registerIpc) where tests can reach it without Electron.
 *
 * Order matters: the app scheme must be registered as privileged before `ready`; the sandbox is
 * enabled for every renderer before any window exists; guards attach in 'web-contents-created' so
 * no webContents (not even a future one) escapes them.
 */
import { app, BrowserWindow, dialog, ipcMain, Menu, protocol, session, type WebContents } from 'electron';
import { join, resolve } from 'node:path';
import type { FileKind, Result } from '../../renderer/bridge/contract';
import { shellChannels, type MenuCommand } from '../ipc/channels';
import type { BridgeDialogs } from '../ipc/handlers';
import { createBridgeHandlers } from '../ipc/services';
import { APP_INDEX_URL, APP_SCHEME } from './appUrl';
import { dialogTitles, fileFilters } from './fileFilters';
import { denyPermissionCheck, denyPermissionRequest, guardContents } from './guards';
import { closeChoice, closePrompt, createCrashPolicy, fileFromArgv } from './lifecycle';
import { cautionsText, menuSections, toTemplate, type ShellAction } from './menu';
import { serveAppRequest } from './protocol';
import { registerIpc } from './registerIpc';
import { savePdf } from '../services/report/savePdf';
import { reportWindowOptions, windowOptions } from './windowOptions';

/** Folder of the bundled main script (dist/main); the preload and renderer sit beside it. */
function bundleDir(): string {
  return typeof __dirname === 'string' ? __dirname : resolve('dist/main');
}

const paths = {
  preload: () => join(bundleDir(), 'preload.cjs'),
  renderer: () => join(bundleDir(), '..', 'renderer'),
};

let mainWindow: BrowserWindow | null = null;
/** Unsaved-changes flag per webContents id, as last reported by the renderer. */
const dirty = new Map<number, boolean>();
/** A file the OS asked to open before the window existed (macOS 'open-file' at launch). */
let pendingOpen: string | null = null;
/** Set once the user has answered "close without saving", so the second close goes through. */
const closing = new Set<number>();

function sendCommand(command: MenuCommand): void {
  mainWindow?.webContents.send(shellChannels.command, command);
}

function nativeDialogs(): BridgeDialogs {
  return {
    async chooseOpenPath(kind: FileKind) {
      const options = { title: dialogTitles[kind].open, filters: [...fileFilters[kind]], properties: ['openFile' as const] };
      const result = mainWindow ? await dialog.showOpenDialog(mainWindow, options) : await dialog.showOpenDialog(options);
      return result.canceled ? null : (result.filePaths[0] ?? null);
    },
    async chooseSavePath(kind: FileKind, suggestedName: string) {
      const options = { title: dialogTitles[kind].save, filters: [...fileFilters[kind]], defaultPath: suggestedName };
      const result = mainWindow ? await dialog.showSaveDialog(mainWindow, options) : await dialog.showSaveDialog(options);
      return result.canceled ? null : (result.filePath ?? null);
    },
  };
}

const handlers = createBridgeHandlers({
  userDataDir: app.getPath('userData'),
  dialogs: nativeDialogs(),
  appRoot: app.getAppPath(),
  // Spreadsheets are untrusted input: parse them in a worker with size, time and heap limits.
  isolateImports: true,
  onRecentFilesChanged: (recent) => buildMenu(recent),
});

function runShellAction(action: ShellAction): void {
  const detail = action === 'about' ? `Version ${app.getVersion()}\n\n${cautionsText}` : cautionsText;
  const title = action === 'about' ? 'About Weighbridge' : 'Cautions';
  const options = { type: 'info' as const, title, message: title, detail, buttons: ['OK'] };
  void (mainWindow ? dialog.showMessageBox(mainWindow, options) : dialog.showMessageBox(options));
}

function buildMenu(recentFiles: readonly string[]): void {
  const sections = menuSections({ platform: process.platform, recentFiles, developer: !app.isPackaged });
  Menu.setApplicationMenu(Menu.buildFromTemplate(toTemplate(sections, { sendCommand, runShellAction })));
}

/** The summary report, printed by Chromium in a hidden, script-less window, then saved atomically. */
async function printReportToPdf(html: string, path: string): Promise<Result<{ path: string }>> {
  const win = new BrowserWindow(reportWindowOptions());
  try {
    await win.loadURL(`data:text/html;charset=utf-8,${encodeURIComponent(html)}`);
    const pdf = await win.webContents.printToPDF({ pageSize: 'A4', printBackground: true });
    return await savePdf(path, pdf);
  } catch (e) {
    return { ok: false, code: 'internal', message: `The report could not be printed: ${e instanceof Error ? e.message : String(e)}` };
  } finally {
    win.destroy();
  }
}

function onSetDirty(senderId: number, value: boolean): void {
  dirty.set(senderId, value);
}

function watchClose(win: BrowserWindow): void {
  const id = win.webContents.id;
  win.on('close', (event) => {
    if (closing.has(id) || !dirty.get(id)) return;
    event.preventDefault();
    void dialog.showMessageBox(win, closePrompt).then(({ response }) => {
      const choice = closeChoice(response);
      if (choice === 'save') {
        // The renderer saves (asking for a path if the course was never saved) and reports
        // setDirty(false); the window stays open so a cancelled or failed save loses nothing,
        // and the next close goes through without asking.
        sendCommand('save');
      } else if (choice === 'discard') {
        closing.add(id);
        void handlers.discardRecovery().finally(() => win.close());
      }
    });
  });
}

function watchCrashes(win: BrowserWindow): void {
  const policy = createCrashPolicy();
  win.webContents.on('render-process-gone', (_event, details) => {
    const decision = policy.onGone(details.reason);
    // The reloaded page finds the recovery copy (autosaved on every change) and offers it.
    if (decision === 'reload') win.webContents.reload();
    if (decision === 'give-up') {
      dialog.showErrorBox('Weighbridge stopped responding', 'The window crashed several times. Your latest changes are kept in the recovery copy, offered when you start Weighbridge again.');
      app.quit();
    }
  });
}

function createWindow(launchFile: string | null): BrowserWindow {
  const win = new BrowserWindow(windowOptions(paths.preload()));
  // Read now: a closed window's webContents is destroyed and may no longer be asked.
  const id = win.webContents.id;
  win.once('ready-to-show', () => win.show());
  if (launchFile) win.webContents.once('did-finish-load', () => sendCommand({ kind: 'open-recent', path: launchFile }));
  watchClose(win);
  watchCrashes(win);
  win.on('closed', () => {
    dirty.delete(id);
    closing.delete(id);
    if (mainWindow === win) mainWindow = null;
  });
  void win.loadURL(APP_INDEX_URL);
  return win;
}

function start(): void {
  // Every renderer sandboxed, whatever its own preferences say.
  app.enableSandbox();
  protocol.registerSchemesAsPrivileged([{ scheme: APP_SCHEME, privileges: { standard: true, secure: true, supportFetchAPI: true } }]);

  if (!app.requestSingleInstanceLock()) {
    app.quit();
    return;
  }
  app.on('second-instance', (_event, argv) => {
    if (!mainWindow) return;
    if (mainWindow.isMinimized()) mainWindow.restore();
    mainWindow.focus();
    const file = fileFromArgv(argv, app.isPackaged);
    if (file) sendCommand({ kind: 'open-recent', path: file });
  });
  // macOS "Open with" and drops on the dock icon.
  app.on('open-file', (event, path) => {
    event.preventDefault();
    if (mainWindow) sendCommand({ kind: 'open-recent', path });
    else pendingOpen = path;
  });
  app.on('web-contents-created', (_event, contents: WebContents) => guardContents(contents));
  app.on('window-all-closed', () => app.quit());

  registerIpc(ipcMain, handlers, { onSetDirty, printReportToPdf });

  void app.whenReady().then(async () => {
    const rendererDir = paths.renderer();
    protocol.handle(APP_SCHEME, (request) => serveAppRequest(request, rendererDir));
    // Nothing is ever loaded from file://, so refuse it outright.
    protocol.handle('file', () => new Response('file:// is not served', { status: 403 }));
    session.defaultSession.setPermissionRequestHandler(denyPermissionRequest);
    session.defaultSession.setPermissionCheckHandler(denyPermissionCheck);
    const recent = await handlers.recentFiles();
    buildMenu(recent.ok ? recent.value : []);
    mainWindow = createWindow(pendingOpen ?? fileFromArgv(process.argv, app.isPackaged));
  });
}

start();

/**
 * The names of every message between the renderer and the main process, and nothing else.
 *
 * The preload imports this file, and a sandboxed preload may `require` only 'electron' and a few
 * built-ins, so it must stay tiny: no zod, no services, no Node modules — types and string
 * constants only. The schemas and handlers that give each name its meaning are in `table.ts`.
 */
import type { DesktopBridge, MenuCommand, ShellExtras } from '../../renderer/bridge/contract';

/**
 * Members of the renderer's bridge object that are not request/response calls served by
 * `main/services`: a property, and the shell-only extras the preload adds (see `ShellExtras`).
 * Listed here so that the check below still holds once the contract carries them too.
 */
type NotServiceCalls = 'hasNativeDialogs' | keyof ShellExtras;

/** A DesktopBridge method that the main process serves through `main/services`. */
export type BridgeMethod = Exclude<keyof DesktopBridge, NotServiceCalls>;

/** Every service call, in the order the contract lists them. */
export const bridgeMethods = [
  'chooseOpenPath',
  'chooseSavePath',
  'previewSpreadsheet',
  'importSpreadsheet',
  'previewMerge',
  'loadProject',
  'saveProject',
  'exportFinals',
  'writeRecovery',
  'readRecovery',
  'discardRecovery',
  'recentFiles',
  'demoCourse',
] as const satisfies readonly BridgeMethod[];

// Compile-time proof that the list is exactly the contract's methods: a method added to
// DesktopBridge and forgotten here makes `MissingMethods` non-never and this line fail to compile.
type MissingMethods = Exclude<BridgeMethod, (typeof bridgeMethods)[number]>;
const everyMethodListed: [MissingMethods] extends [never] ? true : MissingMethods = true;
void everyMethodListed;

const channelPrefix = 'wb:';

/** The ipcMain/ipcRenderer channel of a bridge method, e.g. 'wb:previewSpreadsheet'. */
export function channelFor<M extends BridgeMethod>(method: M): `wb:${M}` {
  return `${channelPrefix}${method}`;
}

const methodSet: ReadonlySet<string> = new Set(bridgeMethods);

/** True when `name` is one of the bridge methods (an own name, never a prototype key). */
export function isBridgeMethod(name: string): name is BridgeMethod {
  return methodSet.has(name);
}

/**
 * Channels that belong to the shell, not to `main/services`.
 * - `command`: main → renderer, one menu command per message (`MenuCommand`).
 * - `setDirty`: renderer → main (invoke), whether there are unsaved changes, so that closing the
 *   window can ask first. Payload `[dirty: boolean]`.
 */
export const shellChannels = {
  command: 'wb:command',
  setDirty: 'wb:setDirty',
  printReportToPdf: 'wb:printReportToPdf',
} as const;

export type { MenuCommand, ShellExtras };

/** The whole object the preload puts on `window.weighbridge`. */
export type PreloadApi = DesktopBridge & ShellExtras;

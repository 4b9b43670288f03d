/**
 * What each bridge method does: the service it calls, plus the little bookkeeping that belongs to
 * no single service (file dialogs, recent files). Arguments arrive here already validated by
 * `dispatchBridgeCall`; handlers return Results and do not throw on expected failures.
 */
import type { DesktopBridge, FileKind, Result } from '../../renderer/bridge/contract';
import type { ImportLimits, WorkerEntry } from '../services/untrusted';
import type { BridgeHandlers } from './dispatch';
import { failure } from './dispatch';

/** Native file dialogs (Electron). Each resolves to the chosen path, or null when cancelled. */
export interface BridgeDialogs {
  chooseOpenPath(kind: FileKind): Promise<string | null>;
  chooseSavePath(kind: FileKind, suggestedName: string): Promise<string | null>;
}

export interface BridgeDeps {
  /** Folder for the recovery copy and the recent-files list (Electron's userData, or a temp dir). */
  readonly userDataDir: string;
  /** null in the browser harness: there the UI asks for a path instead (`hasNativeDialogs` false). */
  readonly dialogs: BridgeDialogs | null;
  /** Where demo-data/ lives (the app's root); the demo service's default when absent. */
  readonly appRoot?: string;
  /**
   * Parse spreadsheets in a worker thread (main/services/untrusted) rather than in this process.
   * The Electron shell and the browser harness set it; without it (tests of the direct reading)
   * only the size limit applies.
   */
  readonly isolateImports?: boolean;
  /** The parsing worker's code (with isolateImports); defaultWorkerEntry() when absent. */
  readonly importWorker?: WorkerEntry;
  /**
   * Size, time and heap limits for reading (the direct reading applies the size only); the defaults of
   * main/services/untrusted when absent. The limits of each request (ImportLimitsRequest) override them.
   */
  readonly importLimits?: Partial<ImportLimits>;
  /** Called after the recent-files list changed, e.g. to rebuild the native "Open recent" menu. */
  readonly onRecentFilesChanged?: (paths: readonly string[]) => void;
}

/**
 * The services the bridge needs, in the contract's own terms. `nodeServices` (services.ts) binds
 * them to `main/services`; keeping the seam here means the wiring below is the same for every
 * transport and every test.
 */
export type BridgeServices = Omit<DesktopBridge, 'hasNativeDialogs' | 'chooseOpenPath' | 'chooseSavePath'> & {
  /** Put `path` at the top of the recent-files list; resolves to the new list. */
  addRecentFile(path: string): Promise<Result<readonly string[]>>;
};

const noDialogs = failure('no-dialogs', 'This window has no file dialogs: type the full path of the file instead.');

/** Wire every bridge method to its service. */
export function createHandlersFrom(services: BridgeServices, deps: BridgeDeps): BridgeHandlers {
  /** Remember an opened/saved file. A failure to record it must not fail the open itself. */
  async function remember(path: string): Promise<void> {
    const list = await services.addRecentFile(path).catch(() => null);
    if (list?.ok) deps.onRecentFilesChanged?.(list.value);
  }

  return {
    async chooseOpenPath(kind) {
      if (!deps.dialogs) return noDialogs;
      return { ok: true, value: await deps.dialogs.chooseOpenPath(kind) };
    },
    async chooseSavePath(kind, suggestedName) {
      if (!deps.dialogs) return noDialogs;
      return { ok: true, value: await deps.dialogs.chooseSavePath(kind, suggestedName) };
    },
    async previewSpreadsheet(path, override) {
      const result = await services.previewSpreadsheet(path, override);
      if (result.ok) await remember(path);
      return result;
    },
    importSpreadsheet: (path, layout, limits) => services.importSpreadsheet(path, layout, limits),
    previewMerge: (current, path, layout, limits) => services.previewMerge(current, path, layout, limits),
    async loadProject(path) {
      const result = await services.loadProject(path);
      if (result.ok) await remember(path);
      return result;
    },
    async saveProject(path, project) {
      const result = await services.saveProject(path, project);
      if (result.ok) await remember(result.value.path);
      return result;
    },
    // The request carries the open project's path (`projectPath`), so the export can refuse to
    // replace it; it is passed on whole.
    exportFinals: (request) => services.exportFinals(request),
    writeRecovery: (projectPath, projectJson) => services.writeRecovery(projectPath, projectJson),
    readRecovery: () => services.readRecovery(),
    discardRecovery: () => services.discardRecovery(),
    recentFiles: () => services.recentFiles(),
    demoCourse: () => services.demoCourse(),
  };
}

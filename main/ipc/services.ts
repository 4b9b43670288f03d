/**
 * Binds the bridge to the real `main/services`: the spreadsheet reader (isolated, or direct with
 * only the size limit), the project store, the export writer, the recovery copy and recent-files
 * list (both kept in `userDataDir`) and the demo course. This is the only file of main/ipc that imports the services themselves.
 */
import type { ImportLimitsRequest, Result } from '../../renderer/bridge/contract';
import { createRecentFiles, createRecoveryStore } from '../services/appState';
import { loadDemoCourse } from '../services/demo';
import { writeExport } from '../services/export';
import { loadProject, saveProject } from '../services/project';
import { importSpreadsheet, previewMerge, previewSpreadsheet } from '../services/spreadsheet';
import { checkFileSize, importSpreadsheetIsolated, limitsFromRequest, previewMergeIsolated, previewSpreadsheetIsolated, resolveLimits } from '../services/untrusted';
import type { BridgeHandlers } from './dispatch';
import { createHandlersFrom, type BridgeDeps, type BridgeServices } from './handlers';

export function nodeServices(deps: BridgeDeps): BridgeServices {
  const recovery = createRecoveryStore(deps.userDataDir);
  const recent = createRecentFiles(deps.userDataDir);
  const base = deps.importLimits;
  const isolated = (limits: ImportLimitsRequest | undefined) => ({
    limits: limitsFromRequest(limits, base),
    ...(deps.importWorker === undefined ? {} : { workerEntry: deps.importWorker }),
  });
  // The direct reading has no worker to stop, so only the size limit applies there.
  const checkDirectSize = async (path: string, request: ImportLimitsRequest | undefined): Promise<Result<null>> => {
    const limits = resolveLimits(limitsFromRequest(request, base));
    return limits.ok ? checkFileSize(path, limits.limits.maxBytes) : limits;
  };
  return {
    ...(deps.isolateImports === true
      ? {
          // Untrusted files are parsed in a worker thread with size, time and heap limits, never in
          // the process that holds the window and the user's other files.
          previewSpreadsheet: (path, override) => {
            const { limits, ...read } = override ?? {};
            return previewSpreadsheetIsolated(path, { ...isolated(limits), override: read });
          },
          importSpreadsheet: (path, layout, limits) => importSpreadsheetIsolated(path, layout, isolated(limits)),
          previewMerge: (current, path, layout, limits) => previewMergeIsolated(current, path, layout, isolated(limits)),
        }
      : {
          previewSpreadsheet: async (path, override) => {
            const { limits, ...read } = override ?? {};
            const size = await checkDirectSize(path, limits);
            return size.ok ? previewSpreadsheet(path, read) : size;
          },
          importSpreadsheet: async (path, layout, limits) => {
            const size = await checkDirectSize(path, limits);
            return size.ok ? importSpreadsheet(path, layout) : size;
          },
          previewMerge: async (current, path, layout, limits) => {
            const size = await checkDirectSize(path, limits);
            return size.ok ? previewMerge(current, path, layout) : size;
          },
        }),
    loadProject: (path) => loadProject(path),
    saveProject: (path, project) => saveProject(path, project),
    // dispatchBridgeCall has validated the request against exportRequestSchema already.
    exportFinals: (request) => writeExport(request),
    writeRecovery: (projectPath, projectJson) => recovery.writeJson(projectPath, projectJson),
    readRecovery: () => recovery.read(),
    discardRecovery: () => recovery.discard(),
    recentFiles: () => recent.list(),
    addRecentFile: (path) => recent.add(path),
    demoCourse: () => loadDemoCourse(deps.appRoot),
  };
}

/** The handlers every transport uses: one async function per DesktopBridge method. */
export function createBridgeHandlers(deps: BridgeDeps): BridgeHandlers {
  return createHandlersFrom(nodeServices(deps), deps);
}

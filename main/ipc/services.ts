/**
 * Binds the bridge to the real `main/services`: the spreadsheet reader (isolated), the project store, the
 * export writer, the recovery copy and recent-files list (both kept in `userDataDir`) and the
 * demo course. This is the only file of main/ipc that imports the services themselves.
 */
import { createRecentFiles, createRecoveryStore } from '../services/appState';
import { loadDemoCourse } from '../services/demo';
import { writeExport } from '../services/export';
import { loadProject, saveProject } from '../services/project';
import { importSpreadsheet, previewMerge, previewSpreadsheet } from '../services/spreadsheet';
import { importSpreadsheetIsolated, previewMergeIsolated, previewSpreadsheetIsolated } from '../services/untrusted';
import type { BridgeHandlers } from './dispatch';
import { createHandlersFrom, type BridgeDeps, type BridgeServices } from './handlers';

export function nodeServices(deps: BridgeDeps): BridgeServices {
  const recovery = createRecoveryStore(deps.userDataDir);
  const recent = createRecentFiles(deps.userDataDir);
  const limits = deps.importLimits;
  return {
    ...(deps.isolateImports === true
      ? {
          // Untrusted files are parsed in a worker thread with size, time and heap limits, never in
          // the process that holds the window and the user's other files.
          previewSpreadsheet: (path, override) => previewSpreadsheetIsolated(path, { limits, override }),
          importSpreadsheet: (path, layout) => importSpreadsheetIsolated(path, layout, { limits }),
          previewMerge: (current, path, layout) => previewMergeIsolated(current, path, layout, { limits }),
        }
      : { previewSpreadsheet, importSpreadsheet, previewMerge }),
    loadProject: (path) => loadProject(path),
    saveProject: (path, project) => saveProject(path, project),
    // dispatchBridgeCall has validated the request against exportRequestSchema already.
    exportFinals: (request) => writeExport(request),
    writeRecovery: (projectPath, project) => recovery.write(projectPath, project),
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

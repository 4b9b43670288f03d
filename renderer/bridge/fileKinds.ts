/**
 * Which kind of file a path names, by its extension, for paths that arrive without a kind: a
 * recent file, a file passed on the command line or dropped on the window or dock (the shell
 * sends all of them as `{ kind: 'open-recent', path }`).
 *
 * The renderer cannot import main/, so the lists are written here once and a test
 * (tests/ipc/fileKinds.test.ts) keeps them equal to main's: PROJECT_FILE_EXTENSION in
 * main/services/project and the extensions main/services/spreadsheet reads.
 */

/** The extension Save gives a project file. */
export const PROJECT_FILE_EXTENSION = '.weighbridge';

/** Project files: our own extension, and .json (project files saved under a plain name). */
export const PROJECT_EXTENSIONS: readonly string[] = [PROJECT_FILE_EXTENSION, '.json'];

/** Spreadsheets the importer reads (workbooks and delimited text). */
export const SPREADSHEET_EXTENSIONS: readonly string[] = ['.xlsx', '.xlsm', '.xls', '.ods', '.csv', '.tsv', '.txt', '.tab'];

/** The extension of the file name in `path` (either slash), lower case with its dot; '' when none. */
export function extensionOf(path: string): string {
  const name = path.slice(Math.max(path.lastIndexOf('/'), path.lastIndexOf('\\')) + 1);
  const dot = name.lastIndexOf('.');
  return dot > 0 ? name.slice(dot).toLowerCase() : '';
}

/** 'project' → open it; 'spreadsheet' → import it; null → neither (say so, name the path). */
export function fileKindOfPath(path: string): 'project' | 'spreadsheet' | null {
  const ext = extensionOf(path);
  if (PROJECT_EXTENSIONS.includes(ext)) return 'project';
  if (SPREADSHEET_EXTENSIONS.includes(ext)) return 'spreadsheet';
  return null;
}

/** Native dialog filters per kind of file (what the open and save dialogs offer). */
import type { FileFilter } from 'electron';
import type { FileKind } from '../../renderer/bridge/contract';

export const fileFilters: { readonly [K in FileKind]: readonly FileFilter[] } = {
  spreadsheet: [
    { name: 'Spreadsheets', extensions: ['xlsx', 'xls', 'ods', 'csv', 'tsv', 'txt'] },
    { name: 'All files', extensions: ['*'] },
  ],
  project: [{ name: 'Weighbridge project', extensions: ['weighbridge'] }],
  export: [
    { name: 'Excel workbook', extensions: ['xlsx'] },
    { name: 'CSV', extensions: ['csv'] },
  ],
  report: [{ name: 'PDF document', extensions: ['pdf'] }],
};

export const dialogTitles: { readonly [K in FileKind]: { readonly open: string; readonly save: string } } = {
  spreadsheet: { open: 'Import a score spreadsheet', save: 'Save spreadsheet' },
  project: { open: 'Open a Weighbridge project', save: 'Save the project' },
  export: { open: 'Open an export', save: 'Export final marks' },
  report: { open: 'Open a report', save: 'Save the report as PDF' },
};

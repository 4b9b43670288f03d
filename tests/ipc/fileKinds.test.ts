/**
 * The renderer decides by extension whether a path from the shell (recent file, command line,
 * dock drop) is opened as a project or imported. It cannot import main/, so its lists are a copy:
 * these checks keep them equal to what main/services/project writes and main/services/spreadsheet
 * reads.
 */
import { describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { extensionOf, fileKindOfPath, PROJECT_EXTENSIONS, PROJECT_FILE_EXTENSION, SPREADSHEET_EXTENSIONS } from '../../renderer/bridge/fileKinds';
import { PROJECT_FILE_EXTENSION as MAIN_PROJECT_EXTENSION } from '../../main/services/project';
import { previewWorkbookBytes } from '../../main/services/spreadsheet';

const TEXT = new TextEncoder().encode('ID,Quiz 1 (10)\nS1,7\n');

function xlsxBytes(): Uint8Array {
  const wb = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet([['ID', 'Quiz 1 (10)'], ['S1', 7]]), 'Scores');
  return XLSX.write(wb, { type: 'buffer', bookType: 'xlsx' }) as Uint8Array;
}

describe('file kinds by extension (renderer/bridge/fileKinds.ts)', () => {
  it('uses the project extension main saves with', () => {
    expect(PROJECT_FILE_EXTENSION).toBe(MAIN_PROJECT_EXTENSION);
    expect(PROJECT_EXTENSIONS).toContain(MAIN_PROJECT_EXTENSION);
  });

  it('lists as spreadsheets exactly the extensions the importer accepts', () => {
    const workbook = xlsxBytes();
    // Workbooks are recognised from their bytes; a name ending .xlsx/.xls/.ods/.xlsm over text is refused as renamed.
    const candidates = [...SPREADSHEET_EXTENSIONS, ...PROJECT_EXTENSIONS, '.pdf', '.docx', '.md', '.dat', '.xlsb'];
    for (const ext of candidates) {
      const asText = previewWorkbookBytes(TEXT, `marks${ext}`);
      const asWorkbook = previewWorkbookBytes(workbook, `marks${ext}`);
      const accepted = asText.ok || (asWorkbook.ok && ['.xlsx', '.xlsm', '.xls', '.ods'].includes(ext));
      expect([ext, accepted]).toEqual([ext, SPREADSHEET_EXTENSIONS.includes(ext)]);
    }
  });

  it('sends projects to open and spreadsheets to import, whatever the case or slash', () => {
    expect(fileKindOfPath('/home/me/Geo 231.weighbridge')).toBe('project');
    expect(fileKindOfPath('C:\\Courses\\GEO.WEIGHBRIDGE')).toBe('project');
    expect(fileKindOfPath('/home/me/course.json')).toBe('project');
    for (const ext of ['xlsx', 'xls', 'ods', 'csv', 'tsv', 'txt']) {
      expect(fileKindOfPath(`/home/me/marks.${ext.toUpperCase()}`)).toBe('spreadsheet');
    }
    expect(fileKindOfPath('/home/me.d/marks')).toBe(null);
    expect(fileKindOfPath('/home/me/.weighbridge')).toBe(null);
    expect(extensionOf('C:\\a.b\\c.CSV')).toBe('.csv');
  });
});

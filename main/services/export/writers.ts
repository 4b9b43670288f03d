/**
 * Tables → bytes. CSV: UTF-8 with a byte-order mark (spreadsheet programs otherwise guess a legacy
 * code page and garble accented names), comma-delimited, CRLF line ends and quoting as RFC 4180,
 * numbers with a decimal point. xlsx: numbers as numeric cells (`t: 'n'`), text as string cells.
 * In both, text is neutralised against formula injection (neutralise.ts) and numbers never are.
 */
import Papa from 'papaparse';
import * as XLSX from 'xlsx';
import { neutraliseCell, needsNeutralising } from './neutralise';
import type { CellValue, Table } from './tables';

const BOM = '\uFEFF';

function csvCell(v: CellValue): string | number {
  if (v === null) return '';
  return typeof v === 'number' ? v : neutraliseCell(v);
}

export function tableToCsv(table: Table): string {
  return `${BOM}${csvLines([table.header, ...table.rows])}\r\n`;
}

/**
 * Rows as CSV lines joined by CRLF, without BOM or final line end: tableToCsv's body, so a file
 * written in blocks (BOM, then each block + CRLF) has the same bytes as tableToCsv of all rows.
 */
export function csvLines(rows: readonly (readonly CellValue[])[]): string {
  const data = rows.map((r) => r.map(csvCell));
  return Papa.unparse(data, {
    delimiter: ',',
    newline: '\r\n',
    // OWASP: a neutralised field is also quoted. Papa quotes commas, quotes and line breaks itself.
    quotes: (value: unknown) => typeof value === 'string' && value.startsWith("'") && needsNeutralising(value.slice(1)),
    escapeFormulae: false,
  });
}

export const CSV_BOM = BOM;

function xlsxCell(v: CellValue): XLSX.CellObject | undefined {
  if (v === null) return undefined;
  if (typeof v === 'number') return { t: 'n', v };
  return { t: 's', v: neutraliseCell(v) };
}

/** SheetJS sheet names: at most 31 characters, none of : \ / ? * [ ]. */
function sheetName(name: string): string {
  return name.replace(/[:\\/?*[\]]/g, ' ').slice(0, 31);
}

/**
 * Each table becomes a dense SheetJS worksheet (`!data`: one array of cells per row, a blank
 * left as a hole), built straight from the table's rows: SheetJS writes the same XML for it as
 * for the sparse "A1"-keyed sheet (tested byte for byte in tests/services/export/xlsxSheet.test.ts)
 * without a hundred thousand cell keys to build and look up.
 */
export function tablesToXlsx(tables: readonly Table[]): Buffer {
  const book = XLSX.utils.book_new();
  for (const table of tables) {
    const data: (XLSX.CellObject | undefined)[][] = new Array<(XLSX.CellObject | undefined)[]>(table.rows.length + 1);
    data[0] = table.header.map(xlsxCell);
    let width = table.header.length;
    for (let r = 0; r < table.rows.length; r++) {
      const row = table.rows[r] ?? [];
      const cells = new Array<XLSX.CellObject | undefined>(row.length);
      for (let c = 0; c < row.length; c++) cells[c] = xlsxCell(row[c] ?? null);
      data[r + 1] = cells;
      if (row.length > width) width = row.length;
    }
    const sheet = { '!data': data, '!ref': XLSX.utils.encode_range({ s: { r: 0, c: 0 }, e: { r: Math.max(data.length - 1, 0), c: Math.max(width - 1, 0) } }) } as XLSX.WorkSheet;
    XLSX.utils.book_append_sheet(book, sheet, sheetName(table.name));
  }
  return XLSX.write(book, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer;
}

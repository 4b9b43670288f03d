import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import {
  detectAndImport,
  importSpreadsheet,
  previewSpreadsheet,
  previewWorkbookBytes,
} from '../../../main/services/spreadsheet';
import { tempDir, utf8, workbookBytes, writeTemp, type FixtureSheet } from './fixtures';

/** SheetJS's bundled CFB/ZIP container library; typed `any` upstream, narrowed to what is used here. */
interface Container {
  FullPaths: string[];
  FileIndex: { name: string; content: Uint8Array }[];
}
interface ContainerLib {
  read(data: Uint8Array, opts: { type: 'buffer' }): Container;
  write(c: Container, opts: { type: 'buffer'; fileType: 'zip' | 'cfb' }): Uint8Array;
  utils: { cfb_new(): Container; cfb_add(c: Container, path: string, content: Uint8Array): void };
}
const CFB = XLSX.CFB as ContainerLib;

const COURSE: FixtureSheet[] = [
  {
    name: 'Scores',
    rows: [
      ['ID', 'Name', 'Quiz 1 (10)', 'Exam (50)'],
      ['1', 'Ann', 8, 41.5],
      ['2', 'Bo', 'EX', 38],
    ],
  },
];
const EXPECTED_SCORES = [
  [{ kind: 'earned', points: 8 }, { kind: 'earned', points: 41.5 }],
  [{ kind: 'excused' }, { kind: 'earned', points: 38 }],
];

function sha(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

describe('workbook formats', () => {
  it.each(['xlsx', 'ods', 'xls'] as const)('reads %s written by the xlsx library', async (bookType) => {
    const dir = tempDir();
    // The extension is deliberately wrong for xls: the type comes from the bytes.
    const path = writeTemp(dir, bookType === 'xls' ? 'course.xls' : `course.${bookType}`, workbookBytes(COURSE, bookType));
    const p = await previewSpreadsheet(path);
    expect(p.ok && p.value.format).toBe(bookType);
    expect(p.ok && p.value.path).toBe(path);
    const r = await detectAndImport(path);
    if (!r.ok) throw new Error(r.message);
    expect(r.value.gradebook.scores).toEqual(EXPECTED_SCORES);
    expect(r.value.gradebook.students.map((s) => s.id)).toEqual(['1', '2']);
  });

  it('detects the real type from the bytes, not the name', () => {
    const p = previewWorkbookBytes(workbookBytes(COURSE, 'ods'), 'exported.xlsx');
    expect(p.ok && p.value.format).toBe('ods');
  });

  it('the preview holds at most 50 rows per sheet, with the totals, and the SHA-256 of the bytes', () => {
    const rows: (string | number)[][] = [['ID', 'Name', 'Quiz (10)']];
    for (let i = 1; i <= 120; i++) rows.push([`s${i}`, `Student ${i}`, i % 11]);
    const bytes = workbookBytes([{ name: 'Big', rows }]);
    const p = previewWorkbookBytes(bytes, 'big.xlsx');
    if (!p.ok) throw new Error(p.message);
    expect(p.value.sheets[0]?.rows.length).toBe(50);
    expect(p.value.sheets[0]?.totalRows).toBe(121);
    expect(p.value.sheets[0]?.totalColumns).toBe(3);
    // node:crypto is the independent hash here.
    expect(p.value.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
    expect(p.value.sha256).toMatch(/^[0-9a-f]{64}$/);
  });

  it('preview and import never change the source file', async () => {
    const dir = tempDir();
    const path = writeTemp(dir, 'course.xlsx', workbookBytes(COURSE));
    const before = sha(readFileSync(path));
    const p = await previewSpreadsheet(path);
    if (!p.ok) throw new Error(p.message);
    const r = await importSpreadsheet(path, p.value.detected);
    expect(r.ok).toBe(true);
    await detectAndImport(path);
    expect(sha(readFileSync(path))).toBe(before);
    expect(p.value.sha256).toBe(before);
  });
});

describe('files that are not importable', () => {
  const errorOf = (bytes: Uint8Array, name: string) => {
    const p = previewWorkbookBytes(bytes, name);
    expect(p.ok).toBe(false);
    if (p.ok) return { code: '', message: '' };
    expect(p.problems?.length).toBe(1);
    return { code: p.problems?.[0]?.code, message: p.message };
  };

  it('binary junk named .xlsx', () => {
    const junk = new Uint8Array(2048);
    let x = 12345;
    for (let i = 0; i < junk.length; i++) {
      x = (x * 1103515245 + 12345) % 2147483648;
      junk[i] = x & 0xff;
    }
    expect(errorOf(junk, 'grades.xlsx')).toEqual({
      code: 'wrong-file-type',
      message: 'The file "grades.xlsx" is named .xlsx but its contents are not a spreadsheet workbook (it may be damaged or renamed). Choose a .xlsx, .xls, .ods, .csv or .tsv file.',
    });
  });

  it('binary junk named .csv', () => {
    const junk = new Uint8Array(512).map((_, i) => (i * 7) % 32);
    expect(errorOf(junk, 'grades.csv')).toEqual({
      code: 'wrong-file-type',
      message: 'The file "grades.csv" does not hold text, so it is not a .csv table (it may be damaged or renamed). Choose a .xlsx, .xls, .ods, .csv or .tsv file.',
    });
  });

  it('a PDF', () => {
    expect(errorOf(utf8('%PDF-1.7\n1 0 obj\n'), 'grades.pdf')).toEqual({
      code: 'wrong-file-type',
      message: 'The file "grades.pdf" is not a spreadsheet Weighbridge can import. Choose a .xlsx, .xls, .ods, .csv or .tsv file.',
    });
  });

  it('a ZIP that is a word-processor document', () => {
    const c = CFB.utils.cfb_new();
    CFB.utils.cfb_add(c, '[Content_Types].xml', utf8('<Types/>'));
    CFB.utils.cfb_add(c, 'word/document.xml', utf8('<w:document/>'));
    const zip = CFB.write(c, { type: 'buffer', fileType: 'zip' });
    expect(errorOf(zip, 'report.xlsx').code).toBe('wrong-file-type');
  });

  it('a password-protected workbook (encrypted OOXML in a compound file)', () => {
    // [MS-OFFCRYPTO] §2.3.4: an encrypted package is a compound file with these two streams.
    const c = CFB.utils.cfb_new();
    CFB.utils.cfb_add(c, '/EncryptionInfo', new Uint8Array([4, 0, 4, 0, 0x40, 0, 0, 0]));
    CFB.utils.cfb_add(c, '/EncryptedPackage', new Uint8Array(64).fill(7));
    const bytes = CFB.write(c, { type: 'buffer', fileType: 'cfb' });
    expect(errorOf(bytes, 'secret.xlsx')).toEqual({
      code: 'password-protected',
      message: 'The file "secret.xlsx" is password-protected. Open it in your spreadsheet program, remove the password (save a copy without encryption) and import that copy.',
    });
  });

  it('a truncated workbook', () => {
    const bytes = workbookBytes(COURSE);
    const e = errorOf(bytes.subarray(0, Math.floor(bytes.length / 2)), 'cut.xlsx');
    expect(e.code).toBe('corrupt-file');
    expect(e.message).toMatch(/^The file "cut.xlsx" could not be read: it looks damaged or incomplete \(.+\)\. Open it in your spreadsheet program and save it again as .xlsx, .ods or .csv, or export a fresh copy\.$/);
  });

  it('a truncated .xls', () => {
    const bytes = workbookBytes(COURSE, 'xls');
    expect(errorOf(bytes.subarray(0, 700), 'cut.xls').code).toBe('corrupt-file');
  });

  it('a missing file and a folder', async () => {
    const dir = tempDir();
    const missing = await previewSpreadsheet(join(dir, 'nope.xlsx'));
    expect(missing.ok === false && missing.code).toBe('not-found');
    const folder = await importSpreadsheet(dir, { sheets: [], sectionFrom: 'column', tokens: { excused: [], missing: [], pending: [] } });
    expect(folder.ok === false && folder.code).toBe('bad-input');
  });
});

describe('untrusted workbook content', () => {
  const snapshot = () => ({
    keys: Object.getOwnPropertyNames(Object.prototype).sort(),
    proto: Object.getPrototypeOf({}) === Object.prototype,
    polluted: (({}) as Record<string, unknown>)['polluted'],
  });

  /** A workbook whose XML was edited by hand to carry hostile names. */
  function craftedWorkbook(): Uint8Array {
    const base = workbookBytes([
      {
        name: 'Scores',
        rows: [
          ['ID', 'Name', '__proto__', 'constructor', 'prototype', 'hasOwnProperty'],
          ['Points possible', null, 10, 10, 10, 10],
          ['__proto__', 'constructor', 1, 2, 3, 4],
          ['constructor', '__proto__', 5, 6, 7, 8],
          ['toString', 'prototype', 9, 'EX', 'pending', 10],
        ],
      },
      { name: 'Sheet2', rows: [['polluted', 'yes']] },
      { name: 'Sheet3', rows: [['ID', 'Name'], ['x', 'y']] },
    ]);
    const zip = CFB.read(base, { type: 'buffer' });
    const edit = (path: string, f: (xml: string) => string) => {
      const i = zip.FullPaths.findIndex((p) => p.endsWith(path));
      const entry = zip.FileIndex[i];
      if (entry === undefined) throw new Error(`no ${path} in the fixture`);
      entry.content = utf8(f(new TextDecoder().decode(entry.content)));
    };
    edit('xl/workbook.xml', (xml) =>
      xml
        .replace('name="Sheet2"', 'name="__proto__"')
        .replace('name="Sheet3"', 'name="constructor"')
        .replace('</sheets>', '</sheets><definedNames><definedName name="__proto__">Scores!$A$1</definedName><definedName name="polluted">1</definedName></definedNames>'),
    );
    // Cells addressed by hostile references, and a row numbered "constructor".
    edit('xl/worksheets/sheet2.xml', (xml) =>
      xml.replace('</sheetData>', '<row r="__proto__"><c r="__proto__" t="inlineStr"><is><t>polluted</t></is></c></row><row r="9"><c r="constructor" t="str"><v>x</v></c></row></sheetData>'),
    );
    return CFB.write(zip, { type: 'buffer', fileType: 'zip' });
  }

  it('leaves Object.prototype untouched and imports the safe part', () => {
    const before = snapshot();
    const bytes = craftedWorkbook();
    const p = previewWorkbookBytes(bytes, 'crafted.xlsx');
    expect(snapshot()).toEqual(before);
    if (!p.ok) throw new Error(p.message);
    expect(p.value.problems.map((x) => [x.code, x.at?.sheet])).toContainEqual(['sheet-unreadable', '__proto__']);
    const imported = p.value.detected;
    expect(imported.sheets.map((s) => s.sheet)).toEqual(['Scores']);
    expect(imported.sheets[0]?.columns.map((c) => [c.header, c.role, c.possible])).toEqual([
      ['ID', 'id', undefined],
      ['Name', 'name', undefined],
      ['__proto__', 'assessment', 10],
      ['constructor', 'assessment', 10],
      ['prototype', 'assessment', 10],
      ['hasOwnProperty', 'assessment', 10],
    ]);
    expect(snapshot()).toEqual(before);
  });

  it('builds plain data from hostile IDs, names and headers', async () => {
    const before = snapshot();
    const dir = tempDir();
    const path = writeTemp(dir, 'crafted.xlsx', craftedWorkbook());
    const r = await detectAndImport(path);
    if (!r.ok) throw new Error(r.message);
    const gb = r.value.gradebook;
    expect(gb.students.map((s) => [s.id, s.name])).toEqual([
      ['__proto__', 'constructor'],
      ['constructor', '__proto__'],
      ['toString', 'prototype'],
    ]);
    expect(gb.assessments.map((a) => a.id)).toEqual(['__proto__', 'constructor', 'prototype', 'hasOwnProperty']);
    expect(gb.scores[2]).toEqual([{ kind: 'earned', points: 9 }, { kind: 'excused' }, { kind: 'pending' }, { kind: 'earned', points: 10 }]);
    for (const s of gb.students) expect(Object.getPrototypeOf(s)).toBe(Object.prototype);
    // The result survives a JSON round trip unchanged: no hidden prototype-carried fields.
    expect(JSON.parse(JSON.stringify(gb))).toEqual(gb);
    expect(snapshot()).toEqual(before);
  });

  it('a CSV with hostile headers and cells stays plain text', () => {
    const before = snapshot();
    const p = previewWorkbookBytes(utf8('__proto__,constructor,prototype (10)\n__proto__,{"polluted":1},5\n'), '__proto__.csv');
    expect(snapshot()).toEqual(before);
    expect(p.ok && p.value.sheets[0]?.rows).toEqual([
      ['__proto__', 'constructor', 'prototype (10)'],
      ['__proto__', '{"polluted":1}', '5'],
    ]);
  });
});

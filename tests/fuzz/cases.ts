/**
 * Fuzz inputs: real workbooks (the demo course and workbooks written here with the xlsx library)
 * mutated at the byte level and at the XML level, hostile constructions of the kinds a damaged or
 * crafted file holds, and CSV text built to break a delimited-text reader.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import * as XLSX from 'xlsx';
import type { FuzzCase } from './harness';
import { rawZip, rewriteZip, zipEntries, type RawEntry } from './zip';

const DEMO = join(import.meta.dirname, '../../demo-data');
const enc = new TextEncoder();

type Cell = string | number | boolean | null | { f: string } | { merge: string };

function write(sheets: Record<string, readonly (readonly Cell[])[]>, bookType: 'xlsx' | 'ods' | 'xls', sst = false): Uint8Array {
  const wb = XLSX.utils.book_new();
  for (const [name, rows] of Object.entries(sheets)) {
    const plain = rows.map((r) => r.map((c) => (typeof c === 'object' && c !== null ? null : c)));
    const ws = XLSX.utils.aoa_to_sheet(plain);
    const merges: XLSX.Range[] = [];
    rows.forEach((r, ri) =>
      r.forEach((c, ci) => {
        if (typeof c !== 'object' || c === null) return;
        if ('f' in c) ws[XLSX.utils.encode_cell({ r: ri, c: ci })] = { t: 'n', f: c.f };
        else merges.push(XLSX.utils.decode_range(c.merge));
      }),
    );
    if (merges.length > 0) ws['!merges'] = merges;
    XLSX.utils.book_append_sheet(wb, ws, name);
  }
  return plain(XLSX.write(wb, { type: 'buffer', bookType, bookSST: sst }) as Uint8Array);
}

const COURSE: readonly (readonly Cell[])[] = [
  ['Field methods in glaciology — scores', null, null, null, null],
  ['Student ID', 'Name', 'Section', 'Lab 1 (10)', 'Quiz 1 (20)', 'Total'],
  ['Points possible', null, null, 10, 20, null],
  ['g001', 'Ansel Brekke', 'A', 8.5, '17/20', { f: 'D4+E4' }],
  ['g002', 'Maren Oddsen', 'B', 'EX', '85%', { f: 'D5+E5' }],
  ['g003', 'Tor Lindqvist', 'A', '7,5', null, { f: 'D6+E6' }],
  ['Average', null, null, { f: 'AVERAGE(D4:D6)' }, null, null],
];

const MERGED: readonly (readonly Cell[])[] = [
  [{ merge: 'A1:F1' }, null, null, null, null, null],
  ['ID', 'Name', { merge: 'C2:D2' }, null, 'Exam (50)', 'Notes'],
  ['1', 'Ann', 'Q1', 'Q2', 44, 'late'],
  ['2', 'Bo', 3, 4, { f: '1/0' }, '=HYPERLINK("http://127.0.0.1/","x")'],
];

/**
 * A copy as a plain Uint8Array. A Node Buffer's `slice` is a view, not a copy, so mutating a
 * "slice" of a Buffer base would damage the base for every later case.
 */
function plain(bytes: Uint8Array): Uint8Array {
  return new Uint8Array(bytes);
}

export interface Base {
  readonly name: string;
  readonly fileName: string;
  readonly bytes: Uint8Array;
}

/** The real workbooks every mutation starts from. Zip-based ones are marked for XML edits. */
export function bases(): Base[] {
  const demo = (n: string): Base => ({ name: `demo ${n}`, fileName: n, bytes: plain(readFileSync(join(DEMO, n))) });
  return [
    demo('glaciology-231.xlsx'),
    demo('glaciology-231-sections.xlsx'),
    demo('glaciology-231.csv'),
    { name: 'course xlsx', fileName: 'course.xlsx', bytes: write({ Scores: COURSE }, 'xlsx') },
    { name: 'course xlsx, shared strings', fileName: 'course.xlsx', bytes: write({ Scores: COURSE, 'Sec B': COURSE }, 'xlsx', true) },
    { name: 'merged cells xlsx', fileName: 'merged.xlsx', bytes: write({ M: MERGED }, 'xlsx', true) },
    { name: 'course ods', fileName: 'course.ods', bytes: write({ Scores: COURSE }, 'ods') },
    { name: 'course xls', fileName: 'course.xls', bytes: write({ Scores: COURSE, M: MERGED }, 'xls') },
  ];
}

/** Small bases only, for the many-case families (the demo files are 70 KB each). */
export function smallBases(): Base[] {
  return bases().filter((b) => b.bytes.length < 40_000);
}

// ---------------------------------------------------------------------------------------------
// Byte-level mutations
// ---------------------------------------------------------------------------------------------

export type ByteMutation =
  | { readonly kind: 'truncate'; readonly at: number }
  | { readonly kind: 'flip'; readonly flips: readonly (readonly [number, number])[] }
  | { readonly kind: 'splice'; readonly at: number; readonly remove: number; readonly insert: Uint8Array };

export const byteMutation: fc.Arbitrary<ByteMutation> = fc.oneof(
  fc.record({ kind: fc.constant('truncate' as const), at: fc.double({ min: 0, max: 1, noNaN: true }) }).map((m) => ({ kind: m.kind, at: m.at })),
  fc.record({ kind: fc.constant('flip' as const), flips: fc.array(fc.tuple(fc.nat(), fc.integer({ min: 1, max: 255 })), { minLength: 1, maxLength: 12 }) }),
  fc.record({
    kind: fc.constant('splice' as const),
    at: fc.nat(),
    remove: fc.nat({ max: 64 }),
    insert: fc.uint8Array({ maxLength: 64 }),
  }),
);

export function applyBytes(bytes: Uint8Array, m: ByteMutation): Uint8Array {
  switch (m.kind) {
    case 'truncate':
      return plain(bytes.subarray(0, Math.floor(bytes.length * m.at)));
    case 'flip': {
      const out = plain(bytes);
      for (const [pos, mask] of m.flips) {
        const i = pos % Math.max(1, out.length);
        if (i < out.length) out[i] = (out[i] ?? 0) ^ mask;
      }
      return out;
    }
    case 'splice': {
      const at = m.at % (bytes.length + 1);
      const out = new Uint8Array(bytes.length - Math.min(m.remove, bytes.length - at) + m.insert.length);
      out.set(bytes.subarray(0, at), 0);
      out.set(m.insert, at);
      out.set(bytes.subarray(at + m.remove), at + m.insert.length);
      return out;
    }
  }
}

// ---------------------------------------------------------------------------------------------
// XML-level mutations of zip entries
// ---------------------------------------------------------------------------------------------

/** Values a hostile or broken file puts where the format expects something sane. */
const NASTY_VALUES = [
  '',
  '__proto__',
  'constructor',
  'prototype',
  'toString',
  'A0',
  'A-1',
  'XFD1048576',
  'XFE1',
  'BDWGN1',
  'A1048577',
  'A99999999999',
  'A1:XFD1048576',
  '-1',
  '1e309',
  'NaN',
  '99999999999999999999',
  '0x10',
  '&amp;&lt;',
  '&#0;',
  '&#x110000;',
  '&unknown;',
  '<![CDATA[',
  ']]>',
  '"',
  "'",
  '\u0000',
  '\uFFFF',
  '\uD800',
  '=1+1',
  'str',
  'inlineStr',
  'e',
  'z',
];

const NASTY_FRAGMENTS = [
  '<',
  '>',
  '</row>',
  '<row r="1">',
  '<c r="A1" t="s"><v>99999</v></c>',
  '<c r="A1" t="s"><v>-1</v></c>',
  '<c r="__proto__" t="inlineStr"><is><t>polluted</t></is></c>',
  '<c r="A1" t="inlineStr"><is><t>x</t></is></c>',
  '<c r="ZZ999"><f>1/0</f></c>',
  '<c r="B2"><f t="shared" ref="B2:XFD1048576" si="0">A1*2</f></c>',
  '<c r="C3" t="e"><v>#DIV/0!</v></c>',
  '<c r="D4" t="d"><v>not-a-date</v></c>',
  '<c r="E5" t="b"><v>2</v></c>',
  '<c r="F6" s="99999"><v>1</v></c>',
  '<mergeCells count="1"><mergeCell ref="A1:XFD1048576"/></mergeCells>',
  '<dimension ref="A1:XFD1048576"/>',
  '<cols><col min="1" max="1000000" width="9"/></cols>',
  '<sheet name="__proto__" sheetId="9" r:id="rId99"/>',
  '<definedName name="_xlnm._FilterDatabase">Scores!$A$1:$XFD$1048576</definedName>',
  '<!DOCTYPE x [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;">]>',
  '&b;',
  '<?xml version="1.0"?>',
  '\u0000\u0001\u0002',
];

export type XmlMutation =
  | { readonly kind: 'truncate'; readonly at: number }
  | { readonly kind: 'insert'; readonly at: number; readonly text: string }
  | { readonly kind: 'attribute'; readonly nth: number; readonly value: string }
  | { readonly kind: 'dropTag'; readonly nth: number }
  | { readonly kind: 'duplicate'; readonly at: number; readonly length: number; readonly times: number };

export const xmlMutation: fc.Arbitrary<XmlMutation> = fc.oneof(
  fc.record({ kind: fc.constant('truncate' as const), at: fc.double({ min: 0, max: 1, noNaN: true }) }),
  fc.record({ kind: fc.constant('insert' as const), at: fc.double({ min: 0, max: 1, noNaN: true }), text: fc.oneof(fc.constantFrom(...NASTY_FRAGMENTS), fc.string({ maxLength: 20 })) }),
  fc.record({ kind: fc.constant('attribute' as const), nth: fc.nat(), value: fc.oneof(fc.constantFrom(...NASTY_VALUES), fc.string({ maxLength: 12 })) }),
  fc.record({ kind: fc.constant('dropTag' as const), nth: fc.nat() }),
  fc.record({ kind: fc.constant('duplicate' as const), at: fc.double({ min: 0, max: 1, noNaN: true }), length: fc.integer({ min: 1, max: 200 }), times: fc.integer({ min: 2, max: 50 }) }),
);

export function applyXml(xml: string, m: XmlMutation): string {
  const pos = (f: number) => Math.floor(xml.length * f);
  switch (m.kind) {
    case 'truncate':
      return xml.slice(0, pos(m.at));
    case 'insert':
      return xml.slice(0, pos(m.at)) + m.text + xml.slice(pos(m.at));
    case 'attribute': {
      const attrs = [...xml.matchAll(/="[^"]*"/g)];
      const hit = attrs.length > 0 ? attrs[m.nth % attrs.length] : undefined;
      if (hit?.index === undefined) return xml;
      const escaped = m.value.replace(/"/g, '&quot;');
      return `${xml.slice(0, hit.index)}="${escaped}"${xml.slice(hit.index + hit[0].length)}`;
    }
    case 'dropTag': {
      const tags = [...xml.matchAll(/<\/?[A-Za-z][^>]*>/g)];
      const hit = tags.length > 0 ? tags[m.nth % tags.length] : undefined;
      if (hit?.index === undefined) return xml;
      return xml.slice(0, hit.index) + xml.slice(hit.index + hit[0].length);
    }
    case 'duplicate': {
      const at = pos(m.at);
      const piece = xml.slice(at, at + m.length);
      return xml.slice(0, at) + piece.repeat(m.times) + xml.slice(at);
    }
  }
}

/** The zip parts worth editing in a workbook. */
export function xmlParts(bytes: Uint8Array): string[] {
  return [...zipEntries(bytes).keys()].filter((p) => /\.(xml|rels)$/.test(p));
}

// ---------------------------------------------------------------------------------------------
// Hostile constructions (each one case; sizes chosen to be large but to keep the suite bounded)
// ---------------------------------------------------------------------------------------------

function sheetXml(base: Uint8Array, edit: (xml: string) => string, compression = true): Uint8Array {
  return rewriteZip(base, { 'xl/worksheets/sheet1.xml': edit }, compression);
}

function withSheetData(data: string, extra = ''): (xml: string) => string {
  return (xml) => xml.replace(/<sheetData>.*<\/sheetData>/s, `<sheetData>${data}</sheetData>${extra}`).replace(/<sheetData\/>/, `<sheetData>${data}</sheetData>${extra}`);
}

const HEADER_ROW = '<row r="1"><c r="A1" t="inlineStr"><is><t>ID</t></is></c><c r="B1" t="inlineStr"><is><t>Name</t></is></c><c r="C1" t="inlineStr"><is><t>Quiz (10)</t></is></c></row>';
const STUDENT_ROW = '<row r="2"><c r="A2" t="inlineStr"><is><t>s1</t></is></c><c r="B2" t="inlineStr"><is><t>Ann</t></is></c><c r="C2"><v>7</v></c></row>';

/** Column letters of a 0-based index, without SheetJS's XFD cap. */
function letters(index: number): string {
  let n = index + 1;
  let s = '';
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/**
 * `normal` keeps every kind of case but scales the slowest ones down (row counts, string counts);
 * `long` adds them at full size and the decompression bomb.
 */
export function hostileCases(scale: 'normal' | 'long'): FuzzCase[] {
  const big = scale === 'long';
  const base = write({ Scores: [['ID', 'Name', 'Quiz (10)'], ['s1', 'Ann', 7]] }, 'xlsx');
  const sstBase = write({ Scores: [['ID', 'Name', 'Quiz (10)'], ['s1', 'Ann', 7]] }, 'xlsx', true);
  const cases: FuzzCase[] = [];
  const add = (family: string, fileName: string, bytes: Uint8Array, mayExhaust = false) => cases.push({ family, fileName, bytes, ...(mayExhaust ? { mayExhaust } : {}) });

  add('huge dimension', 'dim.xlsx', sheetXml(base, (x) => x.replace(/<dimension ref="[^"]*"\/>/, '<dimension ref="A1:XFD1048576"/>')));
  add('huge dimension', 'dim-far.xlsx', sheetXml(base, (x) => x.replace(/<dimension ref="[^"]*"\/>/, '<dimension ref="A1:XFD1048576"/>').replace('</sheetData>', '<row r="1048576"><c r="XFD1048576"><v>1</v></c></row></sheetData>')));
  add('huge dimension', 'dim-bad.xlsx', sheetXml(base, (x) => x.replace(/<dimension ref="[^"]*"\/>/, '<dimension ref="A1:ZZZZZZ99999999999"/>')));
  add('1 000 000 columns', 'cols.xlsx', sheetXml(base, (x) => x.replace('<sheetData>', '<cols><col min="1" max="1000000" width="9"/></cols><sheetData>')));
  add('1 000 000 columns', 'cell-col-1e6.xlsx', sheetXml(base, withSheetData(HEADER_ROW + STUDENT_ROW + `<row r="3"><c r="${letters(999_999)}3"><v>1</v></c></row>`)));
  add('1 000 000 columns', 'cols-1e6.csv', enc.encode(`ID,Name,${Array.from({ length: 999_998 }, (_, i) => `Q${i}`).join(',')}\ns1,Ann,7\n`));
  add('1 000 000 columns', 'cols-1e6-last.csv', enc.encode(`ID,Name,Quiz (10)\ns1,Ann,7${','.repeat(999_997)}x\n`));
  add('merged cells', 'merge-all.xlsx', sheetXml(base, (x) => x.replace('</sheetData>', '</sheetData><mergeCells count="1"><mergeCell ref="A1:XFD1048576"/></mergeCells>')));
  add('merged cells', 'merge-many.xlsx', sheetXml(base, (x) => x.replace('</sheetData>', `</sheetData><mergeCells count="20000">${Array.from({ length: 20_000 }, (_, i) => `<mergeCell ref="A${i + 1}:C${i + 1}"/>`).join('')}</mergeCells>`)));
  add('formulas everywhere', 'formulas.xlsx', sheetXml(base, withSheetData(HEADER_ROW + Array.from({ length: 2000 }, (_, i) => `<row r="${i + 2}"><c r="A${i + 2}"><f>ROW()</f></c><c r="B${i + 2}" t="str"><f>HYPERLINK("http://127.0.0.1/","x")</f><v>x</v></c><c r="C${i + 2}"><f>1/0</f><v>#DIV/0!</v></c></row>`).join(''))));
  add('formulas everywhere', 'shared-formula.xlsx', sheetXml(base, withSheetData(HEADER_ROW + '<row r="2"><c r="A2"><f t="shared" ref="A2:XFD1048576" si="0">A1+1</f><v>1</v></c></row>')));
  add('formulas everywhere', 'formula-text.csv', enc.encode(`ID,Name,Quiz (10)\n${Array.from({ length: 500 }, (_, i) => `=cmd|' /C calc'!A${i},+SUM(1;2),@x`).join('\n')}\n`));
  const tenMb = 'x'.repeat(10 * 1024 * 1024);
  add('10 MB single cell', 'big-cell.xlsx', sheetXml(base, withSheetData(HEADER_ROW + `<row r="2"><c r="A2" t="inlineStr"><is><t>${tenMb}</t></is></c><c r="B2" t="inlineStr"><is><t>Ann</t></is></c><c r="C2"><v>7</v></c></row>`)));
  add('10 MB single cell', 'big-cell.csv', enc.encode(`ID,Name,Quiz (10)\ns1,"${tenMb}",7\n`));
  add('10 MB single cell', 'big-header.csv', enc.encode(`ID,${tenMb},Quiz (10)\ns1,Ann,7\n`));
  add('10 MB single cell', 'big-number.xlsx', sheetXml(base, withSheetData(HEADER_ROW + `<row r="2"><c r="A2" t="inlineStr"><is><t>s1</t></is></c><c r="C2"><v>${'9'.repeat(5_000_000)}</v></c></row>`)));
  add('deeply nested shared strings', 'sst-nested.xlsx', rewriteZip(sstBase, { 'xl/sharedStrings.xml': (x) => x.replace(/<si>/, `<si>${'<r><rPr><b/></rPr><t>a</t>'.repeat(1)}${'<r>'.repeat(100_000)}<t>deep</t>${'</r>'.repeat(100_000)}</si><si>`) }, true));
  add('deeply nested shared strings', 'sst-runs.xlsx', rewriteZip(sstBase, { 'xl/sharedStrings.xml': (x) => x.replace(/<si>/, `<si>${'<r><t>ab</t></r>'.repeat(200_000)}</si><si>`) }, true));
  add('deeply nested shared strings', 'sst-huge-count.xlsx', rewriteZip(sstBase, { 'xl/sharedStrings.xml': (x) => x.replace(/count="\d+" uniqueCount="\d+"/, 'count="4294967295" uniqueCount="4294967295"'), 'xl/worksheets/sheet1.xml': (x) => x.replace(/<v>0<\/v>/, '<v>4294967294</v>') }, true));
  add('deeply nested shared strings', 'sst-many.xlsx', rewriteZip(sstBase, { 'xl/sharedStrings.xml': (x) => x.replace('</sst>', `${'<si><t>s</t></si>'.repeat(big ? 300_000 : 50_000)}</sst>`) }, true));
  add('deeply nested shared strings', 'sst-phonetic.xlsx', rewriteZip(sstBase, { 'xl/sharedStrings.xml': (x) => x.replace(/<si>/, `<si>${'<rPh sb="0" eb="1"><t>x</t></rPh>'.repeat(50_000)}`) }, true));
  add('entity expansion', 'laughs.xlsx', rewriteZip(sstBase, { 'xl/sharedStrings.xml': (x) => x.replace(/^<\?xml[^>]*\?>/, `<?xml version="1.0"?><!DOCTYPE sst [${Array.from({ length: 10 }, (_, i) => `<!ENTITY e${i + 1} "${`&e${i};`.repeat(10)}">`).join('').replace('&e0;'.repeat(10), 'lol'.repeat(10))}]>`).replace(/<t>([^<]*)<\/t>/, '<t>&e10;</t>') }, true));
  const rowCount = big ? 60_000 : 5_000;
  const rows = Array.from({ length: rowCount }, (_, i) => `<row r="${i + 2}"><c r="A${i + 2}" t="inlineStr"><is><t>s${i}</t></is></c><c r="C${i + 2}"><v>${i % 11}</v></c></row>`).join('');
  add('many rows', `rows-${rowCount}.xlsx`, sheetXml(base, withSheetData(HEADER_ROW + rows)));
  if (big) {
    const cellRow = `<row>${'<c><v>1</v></c>'.repeat(1000)}</row>`;
    add('decompression bomb', 'bomb.xlsx', sheetXml(base, withSheetData(cellRow.repeat(3000))), true);
  }
  // A long header repeated in the message of every bad score below it: a small file, a flood of text.
  const longHeader = `${'Q'.repeat(big ? 1024 * 1024 : 256 * 1024)} (10)`;
  add('message amplification', 'long-header.csv', enc.encode(`ID,Name,"${longHeader}"\n${Array.from({ length: 2000 }, (_, i) => `s${i},A,${i % 3 === 0 ? 'abc' : '7'}`).join('\n')}\n`));

  // Zips written byte by byte: a deflate stream that is cut after its first block header (SheetJS's
  // own inflate has been seen to loop on such data), a declared size of 4 GiB, a stored entry
  // longer than the file.
  const stored = (edit: (name: string, data: Uint8Array) => RawEntry | null): Uint8Array =>
    rawZip([...zipEntries(base)].flatMap(([name, data]) => {
      const e = edit(name, data);
      return e === null ? [] : [e];
    }));
  const sheet = (name: string) => name === 'xl/worksheets/sheet1.xml';
  add('zip structure', 'stored.xlsx', stored((name, data) => ({ name, method: 0, data })));
  for (const [label, bytes] of [['02', [0x02]], ['04', [0x04]], ['ed-ff', [0xed, 0xff]], ['0c-00', [0x0c, 0x00]]] as const) {
    add('zip structure', `inflate-cut-${label}.xlsx`, stored((name, data) => (sheet(name) ? { name, method: 8, data: Uint8Array.from(bytes), declaredSize: data.length } : { name, method: 0, data })));
  }
  add('zip structure', 'declared-4gib.xlsx', stored((name, data) => (sheet(name) ? { name, method: 0, data, declaredSize: 0xffffffff } : { name, method: 0, data })), true);
  add('zip structure', 'deflate-4gib.xlsx', stored((name, data) => (sheet(name) ? { name, method: 8, data: Uint8Array.from([0x03, 0x00]), declaredSize: 0xffffffff } : { name, method: 0, data })), true);
  add('zip structure', 'no-sheet.xlsx', stored((name, data) => (sheet(name) ? null : { name, method: 0, data })));
  add('zip structure', 'dup-entries.xlsx', rawZip([...zipEntries(base)].flatMap(([name, data]) => [{ name, method: 0 as const, data }, { name, method: 0 as const, data: enc.encode('<x/>') }])));

  // Binary junk and misnamed files.
  const junk = new Uint8Array(4096).map((_, i) => (i * 2654435761) >>> 24);
  for (const name of ['junk.xlsx', 'junk.xls', 'junk.ods', 'junk.csv', 'junk.tsv', 'junk']) add('binary junk', name, junk);
  const pk = junk.slice();
  pk.set([0x50, 0x4b, 0x03, 0x04]);
  add('binary junk', 'pk-junk.xlsx', pk);
  const pkEnd = new Uint8Array(8192);
  pkEnd.set([0x50, 0x4b, 0x03, 0x04]);
  pkEnd.set([0x50, 0x4b, 0x05, 0x06, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0, 0], 8192 - 22);
  add('binary junk', 'pk-central-junk.xlsx', pkEnd);
  const cfb = junk.slice();
  cfb.set([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]);
  add('binary junk', 'cfb-junk.xls', cfb);
  add('binary junk', 'zeros.xlsx', new Uint8Array(100_000));
  add('binary junk', 'nul.csv', enc.encode('ID,Name\u0000,Quiz\n1,\u0000Ann,7\n'));

  // CSV edge cases.
  add('csv', 'mixed.csv', enc.encode('ID,Name;Quiz (10)\tExam (50)\ns1;Ann,7\t40\ns2\tBo;8,41\n'));
  add('csv', 'unmatched.csv', enc.encode('ID,Name,Quiz (10)\ns1,"Ann,7\ns2,Bo,8\n'));
  add('csv', 'unmatched-end.csv', enc.encode(`ID,Name,Quiz (10)\ns1,Ann,7\n"${'a,'.repeat(100_000)}`));
  add('csv', 'quotes-only.csv', enc.encode('"'.repeat(100_001)));
  add('csv', 'cr-only.csv', enc.encode('ID,Name,Quiz (10)\rs1,Ann,7\rs2,Bo,8\r'));
  add('csv', 'bom-middle.csv', enc.encode('\uFEFFID,Name,Quiz (10)\n\uFEFFs1,Ann,7\n'));
  add('csv', 'one-line-huge.csv', enc.encode(`${'ID,Name,Quiz (10)\n'}${'s,A,1;'.repeat(500_000)}`));
  add('csv', 'many-lines.csv', enc.encode(`ID,Name,Quiz (10)\n${'s,A,1\n'.repeat(big ? 300_000 : 20_000)}`));
  add('csv', 'utf16-odd.csv', new Uint8Array([0xff, 0xfe, 0x49, 0x00, 0x44, 0x00, 0x2c]));
  add('csv', 'proto-header.csv', enc.encode('__proto__,constructor,prototype\n__proto__,constructor,1\n'));
  return cases;
}

// ---------------------------------------------------------------------------------------------
// Generated CSV text and grids
// ---------------------------------------------------------------------------------------------

const csvToken = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom('ID', 'Name', 'Section', 'Quiz 1 (10)', 'Exam /50', 'Points possible', 'EX', '-', 'pending', '7,5', '18/20', '85%', 's1', 'Ann', '', '1e309', '-0', '__proto__') },
  { weight: 2, arbitrary: fc.constantFrom(',', ';', '\t', '"', '""', '\n', '\r\n', '\r', '\u0000', '\uFEFF', '=', '+', '@') },
  { weight: 2, arbitrary: fc.string({ maxLength: 8 }) },
  { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 8 }) },
  { weight: 1, arbitrary: fc.double().map(String) },
);

/** Delimited text assembled from header words, scores, delimiters, quotes, NULs and noise. */
export const csvText: fc.Arbitrary<string> = fc.array(csvToken, { maxLength: 120 }).map((t) => t.join(''));

export const textFileName = fc.constantFrom('g.csv', 'g.tsv', 'g.txt', 'g.tab', 'g.xlsx', 'g');

export const textEncoding = fc.constantFrom('utf-8', 'utf-16le', 'windows-1252', 'utf-8-bom');

export function encodeText(text: string, encoding: 'utf-8' | 'utf-16le' | 'windows-1252' | 'utf-8-bom'): Uint8Array {
  if (encoding === 'utf-8') return enc.encode(text);
  if (encoding === 'utf-8-bom') return enc.encode(`\uFEFF${text}`);
  if (encoding === 'utf-16le') {
    const out = new Uint8Array(2 + text.length * 2);
    out.set([0xff, 0xfe]);
    for (let i = 0; i < text.length; i++) {
      out[2 + i * 2] = text.charCodeAt(i) & 0xff;
      out[3 + i * 2] = text.charCodeAt(i) >> 8;
    }
    return out;
  }
  return Uint8Array.from(text, (ch) => ch.charCodeAt(0) & 0xff);
}

const gridCell: fc.Arbitrary<Cell> = fc.oneof(
  fc.constant(null),
  fc.double(),
  fc.integer({ min: -5, max: 120 }),
  fc.boolean(),
  fc.constantFrom('ID', 'Name', 'Section', 'Quiz (10)', 'EX', 'pending', '-', '7,5', '18/20', '85%', 'Points possible', 'Average', '__proto__', 'constructor', '=1+1'),
  fc.string({ maxLength: 10 }),
  fc.constantFrom('SUM(A1:A3)', '1/0', 'A1', 'INDIRECT("A"&ROW())', 'REPT("x",32767)').map((f) => ({ f })),
);

/** A workbook written by the xlsx library from a random grid (with formulas), in any format. */
export const generatedWorkbook: fc.Arbitrary<FuzzCase> = fc
  .record({
    rows: fc.array(fc.array(gridCell, { maxLength: 7 }), { maxLength: 14 }),
    sheetName: fc.constantFrom('Scores', 'Sec A', '__proto__', 'constructor', "O'Brien's", 'Ωμέγα'),
    bookType: fc.constantFrom('xlsx' as const, 'ods' as const, 'xls' as const),
    sst: fc.boolean(),
  })
  .map(({ rows, sheetName, bookType, sst }) => ({
    family: 'generated workbook',
    detail: `${bookType}${sst ? ', shared strings' : ''}`,
    fileName: `gen.${bookType}`,
    bytes: write({ [sheetName]: rows }, bookType, sst),
  }));

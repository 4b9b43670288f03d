/**
 * The generated fuzz families shared by the normal and the long suite; only the number of runs
 * differs. Each family yields FuzzCases for FuzzRunner.
 */
import fc from 'fast-check';
import { applyBytes, applyXml, bases, byteMutation, csvText, encodeText, generatedWorkbook, smallBases, textEncoding, textFileName, xmlMutation, xmlParts, type Base } from './cases';
import type { FuzzCase } from './harness';
import { rewriteZip } from './zip';

export interface Family {
  readonly name: string;
  readonly arbitrary: fc.Arbitrary<FuzzCase>;
  /** Share of the suite's case count. */
  readonly weight: number;
}

const ALL = bases();
const SMALL = smallBases();
const ZIPS = SMALL.filter((b) => b.fileName.endsWith('.xlsx') || b.fileName.endsWith('.ods'));

function pick(list: readonly Base[]): fc.Arbitrary<Base> {
  return fc.constantFrom(...list);
}

/** Byte-level damage to a real workbook: truncated, flipped, spliced. */
const damagedBytes = (list: readonly Base[]): fc.Arbitrary<FuzzCase> =>
  fc.tuple(pick(list), fc.array(byteMutation, { minLength: 1, maxLength: 3 })).map(([b, ms]) => ({
    family: 'damaged bytes',
    detail: ms.map((m) => m.kind).join('+'),
    fileName: b.fileName,
    bytes: ms.reduce((bytes, m) => applyBytes(bytes, m), b.bytes),
  }));

/** Wrong XML inside a valid zip: one part edited (truncated, junk inserted, attributes swapped …). */
const wrongXml: fc.Arbitrary<FuzzCase> = fc
  .tuple(pick(ZIPS), fc.nat(), fc.array(xmlMutation, { minLength: 1, maxLength: 3 }), fc.boolean())
  .map(([b, partIndex, ms, compress]) => {
    const parts = xmlParts(b.bytes);
    const part = parts[partIndex % parts.length] ?? '';
    return {
      family: 'wrong XML',
      detail: `${part}: ${ms.map((m) => m.kind).join('+')}`,
      fileName: b.fileName,
      bytes: rewriteZip(b.bytes, { [part]: (xml) => ms.reduce((x, m) => applyXml(x, m), xml) }, compress),
    };
  });

const delimitedText: fc.Arbitrary<FuzzCase> = fc.tuple(csvText, textEncoding, textFileName).map(([text, encoding, name]) => ({
  family: 'delimited text',
  detail: encoding,
  fileName: name,
  bytes: encodeText(text, encoding),
}));

const junk: fc.Arbitrary<FuzzCase> = fc
  .tuple(fc.uint8Array({ maxLength: 2048 }), fc.constantFrom('x.xlsx', 'x.xls', 'x.ods', 'x.csv', 'x.tsv', 'x', 'x.pdf'), fc.constantFrom<readonly number[]>([], [0x50, 0x4b, 0x03, 0x04], [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1], [0xef, 0xbb, 0xbf], [0xff, 0xfe]))
  .map(([bytes, name, magic]) => {
    const out = new Uint8Array(magic.length + bytes.length);
    out.set(magic);
    out.set(bytes, magic.length);
    return { family: 'binary junk', fileName: name, bytes: out };
  });

export const FAMILIES: readonly Family[] = [
  { name: 'real workbooks with damaged bytes (small bases)', arbitrary: damagedBytes(SMALL), weight: 0.26 },
  { name: 'the demo course with damaged bytes', arbitrary: damagedBytes(ALL.filter((b) => b.name.startsWith('demo'))), weight: 0.06 },
  { name: 'workbooks with wrong XML in their parts', arbitrary: wrongXml, weight: 0.28 },
  { name: 'delimited text: mixed delimiters, stray quotes, NULs, BOMs, encodings', arbitrary: delimitedText, weight: 0.22 },
  { name: 'workbooks written from random grids with formulas', arbitrary: generatedWorkbook, weight: 0.1 },
  { name: 'binary junk under spreadsheet names', arbitrary: junk, weight: 0.08 },
];

/** Runs per family for a suite of about `total` generated cases (at least 1 each). */
export function runsFor(family: Family, total: number): number {
  return Math.max(1, Math.round(family.weight * total));
}

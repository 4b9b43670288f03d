/**
 * The command line's streaming import (main/services/spreadsheet/stream.ts, `streamImportText`)
 * beside the in-memory import it stands in for (detectAndImportWhole: the whole book read, then
 * detected and imported — the reference the row-at-a-time imports are all held to). Random text
 * tables (randomTables.ts) are written to a file in one of the encodings the reader detects, and
 * their rows past the head are changed so that many of them would change the layout the first
 * rows decide: a filled cell in a blank-header column the head leaves empty, a cell far past the
 * head's width, students only below the head. Wherever the stream gives a Result it must be the
 * in-memory one, compared deeply (toStrictEqual: the gradebook rows it hands on, the layout, every
 * problem in the same order, or the same refusal); where it gives null, the command line imports
 * in memory (main/cli.ts), so the result is the reference by construction. A second test shows
 * the sample really holds tables whose later rows change the layout, and that those all stream null.
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { isDeepStrictEqual } from 'node:util';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { detectAndImportWhole, streamImportText } from '../../../main/services/spreadsheet';
import { detectLayout } from '../../../main/services/spreadsheet/detectLayout';
import { readBook } from '../../../main/services/spreadsheet/readBook';
import { HEAD_ROWS } from '../../../main/services/spreadsheet/textHead';
import type { Gradebook, Score, Student } from '../../../renderer/engine/model';
import { DEFAULT_TOKENS } from '../../../renderer/engine/grading/parseScore';
import { table, text, type Table } from './randomTables';

type Encoding = 'utf-8' | 'utf-8-bom' | 'utf-16le' | 'utf-16le-bom' | 'utf-16be-bom' | 'windows-1252';

/** The text in `encoding`. Windows-1252: Latin-1 for the characters used here, and 0x97 for "—" (the code page's em dash). */
function encode(source: string, encoding: Encoding): Uint8Array {
  const le = () => Buffer.from(source, 'utf16le');
  switch (encoding) {
    case 'utf-8':
      return Buffer.from(source, 'utf8');
    case 'utf-8-bom':
      return Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(source, 'utf8')]);
    case 'utf-16le':
      return le();
    case 'utf-16le-bom':
      return Buffer.concat([Buffer.from([0xff, 0xfe]), le()]);
    case 'utf-16be-bom':
      return Buffer.concat([Buffer.from([0xfe, 0xff]), le().swap16()]);
    case 'windows-1252':
      return Uint8Array.from(source, (ch) => (ch === '—' ? 0x97 : ch.charCodeAt(0)));
  }
}

type Late = 'none' | 'blank-column' | 'far-right' | 'whitespace-only';

interface Case {
  readonly t: Table;
  readonly late: Late;
  readonly encoding: Encoding;
  readonly name: string;
}

/**
 * Below the head (and a few rows above its end), one row changed: 'blank-column' inserts a column
 * with a blank header after the third and fills it in that row only; 'far-right' fills a cell
 * five columns past the row's end; 'whitespace-only' puts a blank-looking cell there (which
 * changes nothing). Some names get a letter outside ASCII, so the encodings differ. `changing`
 * false: neither randomTables nor this adds a late change, so most long tables stream to the end.
 */
function cases(changing: boolean): fc.Arbitrary<Case> {
  return fc
    .record({
      t: changing ? table : table.filter((t) => t.late === 'none'),
      late: changing ? fc.constantFrom<Late>('none', 'blank-column', 'blank-column', 'far-right', 'whitespace-only') : fc.constantFrom<Late>('none', 'whitespace-only'),
      at: fc.nat(),
      encoding: fc.constantFrom<Encoding>('utf-8', 'utf-8', 'utf-8-bom', 'utf-16le', 'utf-16le-bom', 'utf-16be-bom', 'windows-1252'),
      // Mostly named for the delimiter, and mostly well-formed: a refusal compares little of the import.
      named: fc.nat(9),
      keepBrokenQuote: fc.nat(3),
    })
    .map(({ t, late, at, encoding, named, keepBrokenQuote }) => {
      const name = (t.delimiter === '\t') === named < 8 ? 't.tsv' : 't.csv';
      const breakQuote = keepBrokenQuote === 0 ? t.breakQuote : null;
      const rows = t.rows.map((row) => row.map((c) => (c === 'Ann' ? 'Anaïs' : c)));
      const from = Math.max(0, HEAD_ROWS - 3);
      const r = rows.length > from ? from + (at % (rows.length - from)) : -1;
      const row = rows[r];
      if (row !== undefined) {
        if (late === 'blank-column') {
          for (const other of rows) if (other.length >= 3) other.splice(3, 0, '');
          if (row.length < 3) row.push('', '', '');
          row.splice(3, 1, 'late note');
        } else if (late === 'far-right') {
          row.push('', '', '', '', 'x');
        } else if (late === 'whitespace-only') {
          row.push('', ' ');
        }
      }
      return { t: { ...t, rows, breakQuote }, late, encoding, name };
    });
}

let work: string;
beforeAll(async () => {
  work = await mkdtemp(join(tmpdir(), 'wb-stream-'));
});
afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

type Detected = ReturnType<typeof detectAndImportWhole>;

/** The stream's Result in the in-memory import's shape: the rows handed to the sink are its gradebook. */
async function streamed(path: string): Promise<Detected | null> {
  let students: Student[] = [];
  let scores: Score[][] = [];
  let begun = 0;
  const result = await streamImportText(path, {
    begin() {
      begun++;
      students = [];
      scores = [];
    },
    row(student, rowScores) {
      students.push(student);
      scores.push([...rowScores]); // the sink's array is reused after the call
    },
  });
  if (result === null || !result.ok) return result;
  expect(begun).toBe(1);
  expect(result.value.students).toBe(students.length);
  const gradebook: Gradebook = { students, assessments: result.value.assessments, scores };
  return { ok: true, value: { gradebook, problems: result.value.problems, layout: result.value.layout } };
}

async function run(c: Case): Promise<{ bytes: Uint8Array; stream: Detected | null; whole: Detected }> {
  const bytes = encode(text(c.t), c.encoding);
  const path = join(work, c.name);
  await writeFile(path, bytes);
  return { bytes, stream: await streamed(path), whole: detectAndImportWhole(bytes, c.name) };
}

/** Whether detection on the first HEAD_ROWS rows alone differs from detection on the whole table (layout or problems). */
function laterRowsChangeLayout(c: Case): boolean {
  const detect = (rows: string[][]) => {
    const read = readBook(encode(text({ ...c.t, rows }), c.encoding), c.name);
    return read.ok ? detectLayout(read.book, DEFAULT_TOKENS) : null;
  };
  return !isDeepStrictEqual(detect(c.t.rows.slice(0, HEAD_ROWS)), detect(c.t.rows));
}

describe('streamed import equals the in-memory import', () => {
  const sameResult = async (c: Case) => {
    const { stream, whole } = await run(c);
    if (stream !== null) expect(stream).toStrictEqual(whole);
  };

  it('random text tables whose later rows would change the layout: the same Result wherever the stream gives one', async () => {
    await fc.assert(fc.asyncProperty(cases(true), sameResult), { numRuns: 120 });
  });

  it('random text tables without such rows: the same Result wherever the stream gives one', async () => {
    await fc.assert(fc.asyncProperty(cases(false), sameResult), { numRuns: 120 });
  });

  it('the samples hold tables whose later rows change the layout (all streamed null, so imported in memory) and long tables streamed to the end', async () => {
    // Fixed samples, so the counts do not depend on the run's seed.
    let changing = 0;
    let changingStreamed = 0;
    for (const c of fc.sample(cases(true), { numRuns: 150, seed: 231 })) {
      if (c.t.breakQuote !== null || !laterRowsChangeLayout(c)) continue;
      changing++;
      if ((await run(c)).stream !== null) changingStreamed++;
    }
    expect(changing).toBeGreaterThan(150 / 8); // 57 of 150 with this seed
    expect(changingStreamed).toBe(0);

    let long = 0;
    let longImported = 0;
    for (const c of fc.sample(cases(false), { numRuns: 150, seed: 231 })) {
      if (c.t.rows.length <= HEAD_ROWS) continue;
      const { stream } = await run(c);
      if (stream !== null) long++;
      if (stream?.ok === true) longImported++;
    }
    // Else the properties above would compare few streamed imports of tables longer than the head.
    expect(long).toBeGreaterThan(150 / 4); // 97 of 150 with this seed
    expect(longImported).toBeGreaterThan(150 / 10); // 39 of 150
  });
});

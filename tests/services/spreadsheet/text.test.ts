/**
 * Text files: encodings written byte for byte, delimiter detection, decimal commas.
 * Byte values: UTF-8 BOM EF BB BF, UTF-16LE BOM FF FE, UTF-16BE BOM FE FF (Unicode Standard
 * §23.8); Windows-1252 "Å" = C5, "ö" = F6, "ë" = EB (WHATWG Encoding Standard, index-windows-1252).
 */
import { describe, expect, it } from 'vitest';
import { detectAndImportBytes, detectEncoding, previewWorkbookBytes } from '../../../main/services/spreadsheet';
import { cp1252, utf16le, utf8 } from './fixtures';

const CSV = 'ID,Name,Quiz 1 (10)\r\n1,"Ångström, Zoë",7\r\n2,Ünal Çelik,9\r\n';
const NAMES = ['Ångström, Zoë', 'Ünal Çelik'];

function names(bytes: Uint8Array, file = 'scores.csv', override?: Parameters<typeof previewWorkbookBytes>[2]) {
  const p = previewWorkbookBytes(bytes, file, override);
  if (!p.ok) throw new Error(p.message);
  return { encoding: p.value.encoding, names: p.value.sheets[0]?.rows.slice(1).map((r) => r[1]) };
}

describe('encodings', () => {
  it('UTF-8 without BOM', () => {
    expect(names(utf8(CSV))).toEqual({ encoding: 'utf-8', names: NAMES });
  });

  it('UTF-8 with BOM: the BOM does not end up in the first header', () => {
    const bytes = new Uint8Array([0xef, 0xbb, 0xbf, ...utf8(CSV)]);
    const p = previewWorkbookBytes(bytes, 'scores.csv');
    expect(p.ok && p.value.sheets[0]?.rows[0]?.[0]).toBe('ID');
    expect(p.ok && p.value.detected.sheets[0]?.columns[0]?.role).toBe('id');
    expect(names(bytes)).toEqual({ encoding: 'utf-8', names: NAMES });
  });

  it('UTF-16LE with BOM, and without', () => {
    expect(names(utf16le(CSV, true))).toEqual({ encoding: 'utf-16le', names: NAMES });
    expect(names(utf16le(CSV, false))).toEqual({ encoding: 'utf-16le', names: NAMES });
  });

  it('UTF-16BE with BOM', () => {
    const le = utf16le(CSV, false);
    const be = new Uint8Array(le.length + 2);
    be[0] = 0xfe;
    be[1] = 0xff;
    for (let i = 0; i < le.length; i += 2) {
      be[i + 2] = le[i + 1] ?? 0;
      be[i + 3] = le[i] ?? 0;
    }
    expect(names(be)).toEqual({ encoding: 'utf-16be', names: NAMES });
  });

  it('Windows-1252 with accented names', () => {
    const bytes = cp1252(CSV);
    expect(bytes[bytes.indexOf(0x22) + 1]).toBe(0xc5); // "Å" is the single byte C5
    expect(detectEncoding(bytes)).toBe('windows-1252');
    expect(names(bytes)).toEqual({ encoding: 'windows-1252', names: NAMES });
  });

  it('the user can override a wrong guess', () => {
    // Valid UTF-8 that was really meant as Windows-1252: "Ã…" is C3 85, which UTF-8 reads as "Å".
    const bytes = cp1252('ID,Name,Quiz (10)\n1,Ã\u0085ngström,5\n'.replace('\u0085', ''));
    const asWindows = names(bytes, 'x.csv', { encoding: 'windows-1252' });
    expect(asWindows.encoding).toBe('windows-1252');
    expect(asWindows.names).toEqual(['Ãngström']);
  });

  it('a wrong encoding override is reported (replaced characters)', () => {
    const p = previewWorkbookBytes(cp1252(CSV), 'scores.csv', { encoding: 'utf-8' });
    expect(p.ok && p.value.problems.map((x) => x.code)).toContain('replaced-characters');
  });
});

describe('delimiters and decimal commas', () => {
  it('";"-delimited with decimal commas: 7,5 → 7.5', () => {
    const text = 'Matrikelnummer;Name;Quiz 1 (10);Quiz 2 (10)\n100;Müller, Anna;7,5;8\n101;Bauer, Jan;10;6,25\n';
    const r = detectAndImportBytes(utf8(text), 'noten.csv');
    if (!r.ok) throw new Error(r.message);
    expect(r.value.layout.delimiter).toBe(';');
    expect(r.value.gradebook.students.map((s) => s.name)).toEqual(['Müller, Anna', 'Bauer, Jan']);
    expect(r.value.gradebook.scores).toEqual([
      [{ kind: 'earned', points: 7.5 }, { kind: 'earned', points: 8 }],
      [{ kind: 'earned', points: 10 }, { kind: 'earned', points: 6.25 }],
    ]);
  });

  it('tab-separated .tsv', () => {
    const r = detectAndImportBytes(utf8('ID\tName\tLab (5)\n1\tAnn\t4,5\n'), 'scores.tsv');
    expect(r.ok && r.value.layout.delimiter).toBe('\t');
    expect(r.ok && r.value.gradebook.scores).toEqual([[{ kind: 'earned', points: 4.5 }]]);
  });

  it('a stated delimiter overrides detection', () => {
    const p = previewWorkbookBytes(utf8('ID|Name|Quiz (10)\n1|Ann|5\n'), 'x.txt', { delimiter: '|' });
    expect(p.ok && p.value.sheets[0]?.rows).toEqual([
      ['ID', 'Name', 'Quiz (10)'],
      ['1', 'Ann', '5'],
    ]);
  });

  it('every cell is text: a leading-zero ID and a date-looking cell stay as written', () => {
    const r = detectAndImportBytes(utf8('ID,Name,Quiz (10)\n007,2026-01-02,5\n'), 'x.csv');
    expect(r.ok && r.value.gradebook.students).toEqual([{ id: '007', name: '2026-01-02', section: '' }]);
  });

  it('a file with unbalanced quotes is refused at its row', () => {
    const p = previewWorkbookBytes(utf8('ID,Name,Quiz (10)\n1,"Ann,5\n2,Bo,6\n'), 'x.csv');
    expect(p.ok).toBe(false);
    expect(!p.ok && p.problems?.[0]?.code).toBe('malformed-text');
    expect(!p.ok && p.message.startsWith('Sheet "x", row 2: the file is not a well-formed delimited table')).toBe(true);
  });

  it('title rows above the header of a ";" file do not confuse delimiter or header detection', () => {
    const text = 'Physik 1 - Wintersemester\n\nMatr.-Nr.;Nachname;Vorname;Gruppe;Übung 1;Übung 2\nPunkte;;;;10;12,5\n200;Weiß;Jürgen;G1;9,5;12\n201;Öztürk;Elif;G2;EX;11\n';
    const r = detectAndImportBytes(cp1252(text), 'physik.csv');
    if (!r.ok) throw new Error(`${r.message} ${JSON.stringify(r.problems)}`);
    expect(r.value.layout.encoding).toBe('windows-1252');
    expect(r.value.layout.delimiter).toBe(';');
    expect(r.value.layout.sheets[0]).toMatchObject({ headerRow: 2, possibleRow: 3 });
    expect(r.value.layout.sheets[0]?.columns.map((c) => c.role)).toEqual(['id', 'lastName', 'firstName', 'section', 'assessment', 'assessment']);
    expect(r.value.gradebook.students).toEqual([
      { id: '200', name: 'Weiß, Jürgen', section: 'G1' },
      { id: '201', name: 'Öztürk, Elif', section: 'G2' },
    ]);
    expect(r.value.gradebook.assessments.map((a) => a.possible)).toEqual([10, 12.5]);
    expect(r.value.gradebook.scores[0]).toEqual([{ kind: 'earned', points: 9.5 }, { kind: 'earned', points: 12 }]);
  });
});

/** Property tests: whatever the bytes or cells, the importer answers with a Result and never throws. */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { detectAndImportBytes, previewWorkbookBytes } from '../../../main/services/spreadsheet';
import { workbookBytes } from './fixtures';

const names = fc.constantFrom('a.xlsx', 'a.xls', 'a.ods', 'a.csv', 'a.tsv', 'a.txt', 'a.pdf', 'a');
const cell = fc.oneof(
  fc.constant(null),
  fc.double({ noNaN: false }),
  fc.integer({ min: -5, max: 120 }),
  fc.constantFrom('', 'EX', 'pending', '-', '7,5', '18/20', '85%', '1,234', '__proto__', 'constructor', 'ID', 'Name', 'Points possible', 'Average'),
  fc.string({ maxLength: 12 }),
);

describe('robustness', () => {
  it('arbitrary bytes under any name: a Result, never an exception', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 600 }), names, (bytes, name) => {
        const p = previewWorkbookBytes(bytes, name);
        expect(typeof p.ok).toBe('boolean');
        if (!p.ok) expect(p.message.length).toBeGreaterThan(0);
        const r = detectAndImportBytes(bytes, name);
        expect(typeof r.ok).toBe('boolean');
      }),
      { numRuns: 300 },
    );
  });

  it('arbitrary grids as workbooks and as CSV: a Result; every located problem names its sheet', () => {
    fc.assert(
      fc.property(fc.array(fc.array(cell, { maxLength: 6 }), { maxLength: 12 }), (rows) => {
        const bytes = workbookBytes([{ name: 'S', rows }]);
        const r = detectAndImportBytes(bytes, 'g.xlsx');
        const problems = r.ok ? r.value.problems : (r.problems ?? []);
        for (const p of problems) if (p.at !== undefined) expect(p.message.startsWith(`Sheet "${p.at.sheet}"`)).toBe(true);
        const csv = rows.map((row) => row.map((c) => (c === null ? '' : `"${String(c).replace(/"/g, '""')}"`)).join(',')).join('\n');
        const t = detectAndImportBytes(new TextEncoder().encode(csv), 'g.csv');
        expect(typeof t.ok).toBe('boolean');
      }),
      { numRuns: 150 },
    );
  });
});

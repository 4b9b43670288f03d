// The export dialog's column helpers (plain functions): order moves, extension swap, preview rows
// drawn from the engine's results. Hand-derived expectations.
import { describe, expect, it } from 'vitest';
import { chosenColumns, defaultColumns, move, previewRows, withExtension } from '../../renderer/ui/export/exportColumns';
import { gradeCourse } from '../../renderer/engine/grading/gradeCourse';
import { book, earned, MISSING, onePlan } from '../engine/analysis/fixtures';

describe('export column helpers', () => {
  it('move: up, down, and no change at either end', () => {
    expect(move(['a', 'b', 'c'], 2, -1)).toEqual(['a', 'c', 'b']);
    expect(move(['a', 'b', 'c'], 0, 1)).toEqual(['b', 'a', 'c']);
    expect(move(['a', 'b', 'c'], 0, -1)).toEqual(['a', 'b', 'c']);
    expect(move(['a', 'b', 'c'], 2, 1)).toEqual(['a', 'b', 'c']);
  });

  it('withExtension swaps .xlsx/.csv, appends otherwise, leaves a blank path blank', () => {
    expect(withExtension('/tmp/marks.xlsx', 'csv')).toBe('/tmp/marks.csv');
    expect(withExtension('/tmp/marks.CSV', 'xlsx')).toBe('/tmp/marks.xlsx');
    expect(withExtension('/tmp/marks', 'csv')).toBe('/tmp/marks.csv');
    expect(withExtension('', 'csv')).toBe('');
  });

  it('defaults: e-mail off, grade points only when the scale has them; chosen keeps order and headers', () => {
    expect(defaultColumns(false).filter((c) => c.included).map((c) => c.field)).toEqual(['id', 'name', 'section', 'final', 'letter']);
    expect(defaultColumns(true).filter((c) => c.included).map((c) => c.field)).toContain('gradePoints');
    const cols = chosenColumns(move(defaultColumns(false), 5, -1));
    expect(cols.map((c) => c.field)).toEqual(['id', 'name', 'section', 'letter', 'final']);
  });

  it('preview rows: the finals as numbers and a blank (null) where there is no mark', () => {
    const b = book([10], [['Ann', 'X', earned(7)], ['Bo', 'X', MISSING]]);
    const results = gradeCourse(b, onePlan(b, { missingAs: 'excluded' })).students;
    const rows = previewRows(b, results, [{ field: 'name', header: 'Name' }, { field: 'final', header: 'Final' }, { field: 'email', header: 'Mail' }]);
    expect(rows).toEqual([['Ann', 70, null], ['Bo', null, null]]);
  });
});

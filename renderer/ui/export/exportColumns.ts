/** The export's column choices and the preview rows — plain functions, so tests and the dialog share them. */
import type { ExportColumn } from '../../bridge/contract';
import type { Gradebook } from '../../engine/model';
import type { StudentResult } from '../../engine/results';

export type ExportField = ExportColumn['field'];

export const EXPORT_CAUTION = "Review against your institution's grading policy before submitting; this file holds identifiable student data.";

export const FIELD_NAMES: Record<ExportField, string> = {
  id: 'Student ID',
  name: 'Name',
  section: 'Section',
  email: 'E-mail',
  final: 'Final %',
  letter: 'Letter',
  gradePoints: 'Grade points',
};

export interface ColumnChoice {
  readonly field: ExportField;
  readonly header: string;
  readonly included: boolean;
}

/** Default order and choice: ID, name, section, final, letter; e-mail and grade points off (grade points on when the scale has them). */
export function defaultColumns(scaleHasPoints: boolean): ColumnChoice[] {
  return (['id', 'name', 'section', 'email', 'final', 'letter', 'gradePoints'] as const).map((field) => ({
    field,
    header: FIELD_NAMES[field],
    included: field === 'email' ? false : field === 'gradePoints' ? scaleHasPoints : true,
  }));
}

export function chosenColumns(choices: readonly ColumnChoice[]): ExportColumn[] {
  return choices.filter((c) => c.included).map((c) => ({ field: c.field, header: c.header }));
}

/** Moves entry `index` by `delta` (−1 up, +1 down); unchanged at the ends. */
export function move<T>(list: readonly T[], index: number, delta: number): T[] {
  const to = index + delta;
  if (to < 0 || to >= list.length) return [...list];
  const out = [...list];
  const [item] = out.splice(index, 1);
  out.splice(to, 0, item as T);
  return out;
}

export type PreviewCell = string | number | null;

/** The first `limit` rows as the export will hold them (values, not formatted text). */
export function previewRows(book: Gradebook, results: readonly StudentResult[], columns: readonly ExportColumn[], limit = 5): PreviewCell[][] {
  return book.students.slice(0, limit).map((s, i) => {
    const r = results[i];
    return columns.map((c): PreviewCell => {
      switch (c.field) {
        case 'id': return s.id;
        case 'name': return s.name;
        case 'section': return s.section;
        case 'email': return s.email ?? null;
        case 'final': return r?.final ?? null;
        case 'letter': return r?.letter ?? null;
        case 'gradePoints': return r?.gradePoints ?? null;
      }
    });
  });
}

/** Same path with the extension for `format` (replacing .xlsx/.csv, or appending). */
export function withExtension(path: string, format: 'xlsx' | 'csv'): string {
  if (path.trim() === '') return path;
  return /\.(xlsx|csv)$/i.test(path) ? path.replace(/\.(xlsx|csv)$/i, `.${format}`) : `${path}.${format}`;
}

export function suggestedExportName(title: string, format: 'xlsx' | 'csv'): string {
  const cleaned = title.replace(/[\\/:*?"<>|]+/g, ' ').replace(/\s+/g, ' ').trim();
  return `${cleaned === '' ? 'course' : cleaned} final marks.${format}`;
}

/**
 * The first rows of a sheet as the file has them, with the layout drawn on: rows above the header
 * are skipped, the header row and the points-possible row are marked in words (not colour
 * alone), and every header column carries its role selector (and points possible for assessments).
 */
import { useId } from 'react';
import type { ColumnRole, SheetLayout, SheetPreview } from '../../bridge/contract';
import { columnLetter } from '../common/columnLetter';
import { NumberField } from '../common/NumberField';
import { roleLabels, roleOrder } from './layoutEdits';

export interface PreviewGridProps {
  preview: SheetPreview;
  /** null when this sheet is not imported: shown plain. */
  layout: SheetLayout | null;
  onRole(index: number, role: ColumnRole): void;
  onPossible(index: number, possible: number | null): void;
}

export function PreviewGrid({ preview, layout, onRole, onPossible }: PreviewGridProps) {
  const gridId = useId();
  const width = Math.max(preview.totalColumns, ...preview.rows.map((r) => r.length), 1);
  const letters = Array.from({ length: width }, (_, i) => columnLetter(i));
  const byIndex = new Map((layout?.columns ?? []).map((c) => [c.index, c]));
  const rowKind = (r: number): 'header' | 'possible' | 'skipped' | 'data' => {
    if (layout === null) return 'data';
    if (r === layout.headerRow) return 'header';
    if (r === layout.possibleRow) return 'possible';
    return r < layout.headerRow ? 'skipped' : 'data';
  };
  const rowTag: Record<ReturnType<typeof rowKind>, string> = { header: 'Header', possible: 'Points possible', skipped: 'Skipped', data: '' };

  return (
    <div className="wb-preview-scroll" role="region" aria-label={`Preview of sheet ${preview.name}`} tabIndex={0}>
      <table className="wb-preview">
        <caption className="wb-visually-hidden">
          First {preview.rows.length} of {preview.totalRows} rows of sheet {preview.name}
          {layout !== null ? `, header row ${layout.headerRow + 1}` : ''}
        </caption>
        <thead>
          <tr>
            <th scope="col" className="wb-preview-corner">Row</th>
            {letters.map((letter, i) => {
              const col = byIndex.get(i);
              return (
                <th key={letter} scope="col" className={`wb-preview-colhead ${col !== undefined ? `wb-role-${col.role}` : ''}`}>
                  <span className="wb-preview-letter">{letter}</span>
                  {col !== undefined && layout !== null && (
                    <span className="wb-preview-controls">
                      <label className="wb-visually-hidden" htmlFor={`${gridId}-role-${i}`}>
                        Role of column {letter} ({col.header})
                      </label>
                      <select
                        id={`${gridId}-role-${i}`}
                        value={col.role}
                        onChange={(e) => onRole(i, e.target.value as ColumnRole)}
                      >
                        {roleOrder.map((r) => (
                          <option key={r} value={r}>{roleLabels[r]}</option>
                        ))}
                      </select>
                      {col.role === 'assessment' && (
                        <NumberField
                          label={`Points possible for ${col.header}`}
                          hideLabel
                          value={col.possible ?? null}
                          allowBlank
                          min={0}
                          onCommit={(v) => onPossible(i, v)}
                          className="wb-preview-possible"
                        />
                      )}
                    </span>
                  )}
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody>
          {preview.rows.map((row, r) => {
            const kind = rowKind(r);
            return (
              <tr key={r} className={`wb-preview-row-${kind}`}>
                <th scope="row" className="wb-preview-rownum">
                  {r + 1}
                  {rowTag[kind] !== '' && <span className="wb-preview-rowtag">{rowTag[kind]}</span>}
                </th>
                {letters.map((letter, c) => {
                  const col = byIndex.get(c);
                  return (
                    <td key={letter} className={col !== undefined && kind !== 'skipped' ? `wb-role-${col.role}` : undefined}>
                      {row[c] ?? ''}
                    </td>
                  );
                })}
              </tr>
            );
          })}
        </tbody>
      </table>
      {preview.totalRows > preview.rows.length && (
        <p className="wb-hint">Showing the first {preview.rows.length} of {preview.totalRows} rows; every row is imported and checked.</p>
      )}
    </div>
  );
}

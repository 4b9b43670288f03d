/**
 * The final-marks table: a real <table> whose body is virtualised with spacer rows, so screen
 * readers get table semantics and 10 000 students still scroll smoothly. Column headers sort
 * (aria-sort says which way); each student's name is a button that selects them.
 */
import { useRef } from 'react';
import { useVirtualizer } from '@tanstack/react-virtual';
import type { Gradebook } from '../../engine/model';
import type { StudentResult } from '../../engine/results';
import { formatPercent } from './resultsAccess';

export type SortKey = 'id' | 'name' | 'section' | 'final' | 'letter' | 'gradePoints';
export interface SortState {
  readonly key: SortKey;
  readonly direction: 'ascending' | 'descending';
}

const ROW_HEIGHT = 34;

const COLUMNS: readonly { key: SortKey; label: string; numeric: boolean }[] = [
  { key: 'id', label: 'ID', numeric: false },
  { key: 'name', label: 'Name', numeric: false },
  { key: 'section', label: 'Section', numeric: false },
  { key: 'final', label: 'Final %', numeric: true },
  { key: 'letter', label: 'Letter', numeric: false },
  { key: 'gradePoints', label: 'Grade points', numeric: true },
];

export interface FinalsTableProps {
  gradebook: Gradebook;
  /** Index-aligned with gradebook.students. */
  results: readonly StudentResult[];
  rows: readonly number[];
  decimals: number;
  sort: SortState;
  onSort(sort: SortState): void;
  selectedId: string | null;
  onSelect(studentId: string): void;
}

export function FinalsTable({ gradebook, results, rows, decimals, sort, onSort, selectedId, onSelect }: FinalsTableProps) {
  const scrollRef = useRef<HTMLDivElement>(null);
  const virtualizer = useVirtualizer({
    count: rows.length,
    getScrollElement: () => scrollRef.current,
    estimateSize: () => ROW_HEIGHT,
    overscan: 10,
  });
  const items = virtualizer.getVirtualItems();
  const padTop = items[0]?.start ?? 0;
  const padBottom = virtualizer.getTotalSize() - (items.at(-1)?.end ?? 0);

  return (
    <div ref={scrollRef} className="wb-finals-scroll">
      <table className="wb-finals" aria-rowcount={rows.length + 1}>
        <caption className="wb-visually-hidden">Final marks, {rows.length} students</caption>
        <thead>
          <tr aria-rowindex={1}>
            {COLUMNS.map((c) => {
              const active = sort.key === c.key;
              return (
                <th key={c.key} scope="col" aria-sort={active ? sort.direction : 'none'} className={c.numeric ? 'wb-num' : undefined}>
                  <button
                    type="button"
                    className="wb-sort-button"
                    onClick={() => onSort({ key: c.key, direction: active && sort.direction === 'ascending' ? 'descending' : 'ascending' })}
                  >
                    {c.label}
                    <span aria-hidden="true" className="wb-sort-mark">{active ? (sort.direction === 'ascending' ? ' ▴' : ' ▾') : ''}</span>
                  </button>
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody>
          {padTop > 0 && <tr aria-hidden="true" className="wb-spacer" style={{ height: padTop }}><td colSpan={COLUMNS.length} /></tr>}
          {items.map((vr) => {
            const i = rows[vr.index];
            const s = i === undefined ? undefined : gradebook.students[i];
            const r = i === undefined ? undefined : results[i];
            if (s === undefined || r === undefined) return null;
            const selected = s.id === selectedId;
            return (
              <tr key={s.id} aria-rowindex={vr.index + 2} className={selected ? 'wb-selected' : undefined} style={{ height: ROW_HEIGHT }} data-student-id={s.id}>
                <td className="wb-mono">{s.id}</td>
                <td>
                  <button type="button" className="wb-link-button" aria-pressed={selected} onClick={() => onSelect(s.id)}>{s.name}</button>
                </td>
                <td>{s.section}</td>
                <td className="wb-num" data-final={r.final === null ? '' : String(r.final)}>{formatPercent(r.final, decimals)}</td>
                <td>{r.letter ?? '—'}</td>
                <td className="wb-num">{r.gradePoints ?? '—'}</td>
              </tr>
            );
          })}
          {padBottom > 0 && <tr aria-hidden="true" className="wb-spacer" style={{ height: padBottom }}><td colSpan={COLUMNS.length} /></tr>}
        </tbody>
      </table>
      {rows.length === 0 && <p className="wb-results-hint">No student matches the filter.</p>}
    </div>
  );
}

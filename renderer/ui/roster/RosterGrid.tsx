/**
 * The virtualised students × assessments grid (ARIA grid pattern with a roving tabindex).
 *
 * Columns: 0 = student (name and ID), 1 = section, 2 = final mark, 3… = assessments. Only the
 * assessment cells are editable. The active row and column are always rendered (added to the
 * virtualiser's range) so keyboard focus never lands on an element that scrolled away.
 */
import { useCallback, useEffect, useId, useLayoutEffect, useRef, useState, type KeyboardEvent } from 'react';
import { defaultRangeExtractor, useVirtualizer, type Range } from '@tanstack/react-virtual';
import type { Gradebook, Score } from '../../engine/model';
import type { ItemStatus } from '../../engine/results';
import type { ScoreTokens } from '../../bridge/contract';
import { acceptedForms, formatScore, parseScore } from '../../engine/grading/parseScore';
import { cellView, formatPoints } from './cellView';

const ROW_HEIGHT = 34;
const HEADER_HEIGHT = 58;
const STUDENT_WIDTH = 220;
const SECTION_WIDTH = 90;
const FINAL_WIDTH = 80;
const ASSESSMENT_WIDTH = 100;
/** Fixed (sticky) columns before the assessments. */
const FIXED = 3;
/** Above this many assessments, columns are virtualised too. */
const COLUMN_VIRTUALISE_AT = 40;

export interface RosterGridProps {
  gradebook: Gradebook;
  /** Student indices to show, in order. */
  rows: readonly number[];
  tokens: ScoreTokens;
  finalFor(studentId: string): number | null;
  statusesFor(studentId: string): ReadonlyMap<string, ItemStatus>;
  onSetScore(studentIndex: number, assessmentIndex: number, score: Score): void;
}

interface Active {
  row: number;
  col: number;
}

interface Editing {
  row: number;
  col: number;
  text: string;
  error: string | null;
}

function withActive(active: number) {
  return (range: Range) => {
    const indexes = defaultRangeExtractor(range);
    if (active >= 0 && active < range.count && !indexes.includes(active)) {
      indexes.push(active);
      indexes.sort((a, b) => a - b);
    }
    return indexes;
  };
}

export function RosterGrid({ gradebook, rows, tokens, finalFor, statusesFor, onSetScore }: RosterGridProps) {
  const gridId = useId();
  const scrollRef = useRef<HTMLDivElement>(null);
  const [active, setActive] = useState<Active>({ row: 0, col: FIXED });
  const [editing, setEditing] = useState<Editing | null>(null);
  const focusPending = useRef(false);
  const assessments = gradebook.assessments;
  const colCount = FIXED + assessments.length;
  const rowCount = rows.length;

  // Keep the active cell inside the grid when filtering shrinks it.
  const row = Math.min(active.row, Math.max(0, rowCount - 1));
  const col = Math.min(active.col, colCount - 1);

  const rowVirtualizer = useVirtualizer({
    count: rowCount,
    getScrollElement: () => scrollRef.current,
    estimateSize: () => ROW_HEIGHT,
    overscan: 8,
    scrollPaddingStart: HEADER_HEIGHT,
    rangeExtractor: withActive(row),
  });
  const virtualiseColumns = assessments.length > COLUMN_VIRTUALISE_AT;
  const colVirtualizer = useVirtualizer({
    horizontal: true,
    count: assessments.length,
    getScrollElement: () => scrollRef.current,
    estimateSize: () => ASSESSMENT_WIDTH,
    overscan: virtualiseColumns ? 4 : assessments.length,
    scrollPaddingStart: STUDENT_WIDTH + SECTION_WIDTH + FINAL_WIDTH,
    rangeExtractor: withActive(col - FIXED),
  });

  const virtualRows = rowVirtualizer.getVirtualItems();
  const virtualCols = colVirtualizer.getVirtualItems();
  const firstColStart = virtualCols[0]?.start ?? 0;
  const totalWidth = STUDENT_WIDTH + SECTION_WIDTH + FINAL_WIDTH + colVirtualizer.getTotalSize();

  const focusCell = useCallback(() => {
    const el = scrollRef.current?.querySelector<HTMLElement>(`[data-cell="${row}:${col}"]`);
    el?.focus({ preventScroll: true });
  }, [row, col]);

  useLayoutEffect(() => {
    if (!focusPending.current || editing !== null) return;
    focusPending.current = false;
    focusCell();
  });

  const moveTo = (nextRow: number, nextCol: number) => {
    const r = Math.max(0, Math.min(rowCount - 1, nextRow));
    const c = Math.max(0, Math.min(colCount - 1, nextCol));
    setActive({ row: r, col: c });
    focusPending.current = true;
    rowVirtualizer.scrollToIndex(r, { align: 'auto' });
    if (c >= FIXED) colVirtualizer.scrollToIndex(c - FIXED, { align: 'auto' });
  };

  const pageRows = Math.max(1, Math.floor(((scrollRef.current?.clientHeight ?? 600) - HEADER_HEIGHT) / ROW_HEIGHT) - 1);

  const startEdit = (r: number, c: number, initial?: string) => {
    if (c < FIXED) return;
    const studentIndex = rows[r];
    if (studentIndex === undefined) return;
    const score = gradebook.scores[studentIndex]?.[c - FIXED];
    const text = initial ?? (score === undefined ? '' : formatScore(score, tokens));
    setEditing({ row: r, col: c, text, error: null });
  };

  /** Commit the edit; true when it was accepted (or unchanged). */
  const commit = (): boolean => {
    if (editing === null) return true;
    const studentIndex = rows[editing.row];
    const assessment = assessments[editing.col - FIXED];
    if (studentIndex === undefined || assessment === undefined) {
      setEditing(null);
      return true;
    }
    const parsed = parseScore(editing.text, assessment.possible, tokens);
    if (!parsed.ok) {
      setEditing({ ...editing, error: parsed.message });
      return false;
    }
    onSetScore(studentIndex, editing.col - FIXED, parsed.score);
    setEditing(null);
    return true;
  };

  const onGridKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    if (editing !== null || rowCount === 0) return;
    const ctrl = e.ctrlKey || e.metaKey;
    let handled = true;
    switch (e.key) {
      case 'ArrowDown': moveTo(row + 1, col); break;
      case 'ArrowUp': moveTo(row - 1, col); break;
      case 'ArrowRight': moveTo(row, col + 1); break;
      case 'ArrowLeft': moveTo(row, col - 1); break;
      case 'Home': moveTo(ctrl ? 0 : row, 0); break;
      case 'End': moveTo(ctrl ? rowCount - 1 : row, colCount - 1); break;
      case 'PageDown': moveTo(row + pageRows, col); break;
      case 'PageUp': moveTo(row - pageRows, col); break;
      case 'Enter':
      case 'F2': startEdit(row, col); break;
      case 'Delete':
      case 'Backspace': startEdit(row, col, ''); break;
      default:
        // Typing a character starts an edit with that character, as in a spreadsheet.
        if (e.key.length === 1 && !ctrl && !e.altKey && col >= FIXED) startEdit(row, col, e.key);
        else handled = false;
    }
    if (handled) e.preventDefault();
  };

  const onEditorKeyDown = (e: KeyboardEvent<HTMLInputElement>) => {
    if (editing === null) return;
    if (e.key === 'Escape') {
      e.preventDefault();
      e.stopPropagation();
      setEditing(null);
      focusPending.current = true;
      return;
    }
    if (e.key === 'Enter' || e.key === 'Tab') {
      e.preventDefault();
      e.stopPropagation();
      if (!commit()) return;
      if (e.key === 'Enter') moveTo(editing.row + (e.shiftKey ? -1 : 1), editing.col);
      else moveTo(editing.row, editing.col + (e.shiftKey ? -1 : 1));
    }
    // Ctrl+Z inside the field is the field's own text undo, not the course's.
    if ((e.ctrlKey || e.metaKey) && (e.key === 'z' || e.key === 'y')) e.stopPropagation();
  };

  // A new filter or course resets a stale editor.
  useEffect(() => {
    setEditing(null);
  }, [rows, gradebook.assessments]);

  const errorId = `${gridId}-edit-error`;

  return (
    <div ref={scrollRef} className="wb-roster-scroll">
      <div
        role="grid"
        aria-label="Scores: students by assessments"
        aria-rowcount={rowCount + 1}
        aria-colcount={colCount}
        aria-readonly={false}
        className="wb-roster-grid"
        style={{ width: totalWidth, height: HEADER_HEIGHT + rowVirtualizer.getTotalSize() }}
        onKeyDown={onGridKeyDown}
      >
        <div role="rowgroup" className="wb-roster-head" style={{ width: totalWidth, height: HEADER_HEIGHT }}>
          <div role="row" aria-rowindex={1} className="wb-roster-row wb-roster-head-row" style={{ height: HEADER_HEIGHT }}>
            <div role="columnheader" aria-colindex={1} className="wb-cell wb-fixed wb-fixed-0" style={{ width: STUDENT_WIDTH }}>Student</div>
            <div role="columnheader" aria-colindex={2} className="wb-cell wb-fixed wb-fixed-1" style={{ width: SECTION_WIDTH, left: STUDENT_WIDTH }}>Section</div>
            <div role="columnheader" aria-colindex={3} className="wb-cell wb-fixed wb-fixed-2 wb-num" style={{ width: FINAL_WIDTH, left: STUDENT_WIDTH + SECTION_WIDTH }}>Final</div>
            <div aria-hidden="true" style={{ width: firstColStart, flex: 'none' }} />
            {virtualCols.map((vc) => {
              const a = assessments[vc.index];
              if (a === undefined) return null;
              return (
                <div
                  key={a.id}
                  role="columnheader"
                  aria-colindex={FIXED + vc.index + 1}
                  className="wb-cell wb-num wb-assessment-head"
                  style={{ width: ASSESSMENT_WIDTH }}
                  title={a.name}
                >
                  <span className="wb-head-name">{a.name}</span>
                  <span className="wb-head-possible">of {formatPoints(a.possible)}</span>
                </div>
              );
            })}
          </div>
        </div>
        <div role="rowgroup" className="wb-roster-body">
          {virtualRows.map((vr) => {
            const studentIndex = rows[vr.index];
            const student = studentIndex === undefined ? undefined : gradebook.students[studentIndex];
            if (studentIndex === undefined || student === undefined) return null;
            const statuses = statusesFor(student.id);
            const scoreRow = gradebook.scores[studentIndex];
            const final = finalFor(student.id);
            const isEditingRow = editing?.row === vr.index;
            const tab = (c: number) => (vr.index === row && c === col ? 0 : -1);
            const common = (c: number) => ({
              'data-cell': `${vr.index}:${c}`,
              tabIndex: tab(c),
              onClick: () => setActive({ row: vr.index, col: c }),
              onDoubleClick: () => startEdit(vr.index, c),
            });
            return (
              <div
                key={student.id}
                role="row"
                aria-rowindex={vr.index + 2}
                className={`wb-roster-row${vr.index % 2 === 1 ? ' wb-row-odd' : ''}${isEditingRow ? ' wb-row-editing' : ''}`}
                style={{ height: ROW_HEIGHT, transform: `translateY(${HEADER_HEIGHT + vr.start}px)`, width: totalWidth }}
              >
                <div role="rowheader" aria-colindex={1} className="wb-cell wb-fixed wb-fixed-0 wb-student" style={{ width: STUDENT_WIDTH }} {...common(0)}>
                  <span className="wb-student-name">{student.name}</span>
                  <span className="wb-student-id">{student.id}</span>
                </div>
                <div role="gridcell" aria-colindex={2} aria-readonly={true} className="wb-cell wb-fixed wb-fixed-1" style={{ width: SECTION_WIDTH, left: STUDENT_WIDTH }} {...common(1)}>
                  {student.section}
                </div>
                <div role="gridcell" aria-colindex={3} aria-readonly={true} className="wb-cell wb-fixed wb-fixed-2 wb-num wb-final" style={{ width: FINAL_WIDTH, left: STUDENT_WIDTH + SECTION_WIDTH }} {...common(2)}
                  aria-label={final === null ? 'no final mark' : `final ${final} %`}
                  data-final={final === null ? '' : String(final)}
                >
                  {final === null ? 'no mark' : `${final}`}
                </div>
                <div aria-hidden="true" style={{ width: firstColStart, flex: 'none' }} />
                {virtualCols.map((vc) => {
                  const a = assessments[vc.index];
                  if (a === undefined) return null;
                  const c = FIXED + vc.index;
                  const view = cellView(scoreRow?.[vc.index], a.possible, statuses.get(a.id));
                  const isEditing = editing !== null && editing.row === vr.index && editing.col === c;
                  if (isEditing) {
                    return (
                      <div key={a.id} role="gridcell" aria-colindex={c + 1} className="wb-cell wb-num wb-cell-editing" style={{ width: ASSESSMENT_WIDTH }} data-cell={`${vr.index}:${c}`}>
                        <input
                          autoFocus
                          className="wb-cell-input"
                          aria-label={`Score for ${student.name}, ${a.name}, of ${formatPoints(a.possible)} points`}
                          aria-invalid={editing.error !== null}
                          aria-describedby={editing.error !== null ? errorId : `${errorId}-hint`}
                          value={editing.text}
                          onChange={(e) => setEditing({ ...editing, text: e.target.value, error: null })}
                          onKeyDown={onEditorKeyDown}
                          onBlur={() => {
                            // Leaving the field with a bad value keeps nothing: the old score stays.
                            if (editing.error === null) commit();
                          }}
                        />
                        <span id={`${errorId}-hint`} className="wb-visually-hidden">{acceptedForms(tokens)}</span>
                        {editing.error !== null && (
                          <span id={errorId} className="wb-cell-error" role="alert">
                            Not changed: {editing.error}
                          </span>
                        )}
                      </div>
                    );
                  }
                  return (
                    <div
                      key={a.id}
                      role="gridcell"
                      aria-colindex={c + 1}
                      aria-label={view.label}
                      className={`wb-cell wb-num wb-cell-${view.state}${view.dropped ? ' wb-cell-dropped' : ''}`}
                      data-state={view.state}
                      data-dropped={view.dropped ? 'true' : undefined}
                      style={{ width: ASSESSMENT_WIDTH }}
                      {...common(c)}
                    >
                      {view.dropped ? <><s>{view.text}</s><span aria-hidden="true">↓</span></> : view.text}
                    </div>
                  );
                })}
              </div>
            );
          })}
        </div>
      </div>
      {rowCount === 0 && <p className="wb-roster-empty">No student matches the filter.</p>}
    </div>
  );
}

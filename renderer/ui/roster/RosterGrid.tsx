/**
 * The virtualised students × assessments grid (ARIA grid pattern with a roving tabindex).
 *
 * Columns: 0 = student (name and ID), 1 = section, 2 = final mark, 3… = assessments. Only the
 * assessment cells are editable. The active row and column are always rendered (rowWindow, and the
 * column virtualiser's range) so keyboard focus never lands on an element that scrolled away.
 *
 * Scrolling cost (measured with bench/scrollTrace.ts, a Chromium trace of the bench's wheel
 * scroll): each long wheel step replaces most rows on screen, so a step costs about what building
 * and painting one screen of rows costs — never work over the whole roster. What keeps it small:
 * - rows are memoised (RosterRow) and get stable props, so rows that stay in view are skipped;
 *   clicks are handled once on the grid, not by a handler per cell;
 * - rows carry no per-row inline style: the rows on screen lie in normal flow under one top
 *   padding. (With a `transform` per row, every row position ever shown was a new inline style,
 *   and style recalculation grew over a long scroll: 3 → 10 ms a step over 10 000 rows.)
 * - the three fixed columns are one sticky block per row, not three sticky cells;
 * - the overscan rows are built after the frame (rowWindow), so the frame builds only the rows it
 *   shows, and only once the scroll stops: during a scroll every step would replace them unseen;
 * - the row cells need only which items were dropped (droppedItems.ts), not the student's whole
 *   explanation, which reading the result's `lines` builds and keeps.
 */
import { useCallback, useDeferredValue, useEffect, useId, useLayoutEffect, useMemo, useRef, useState, type CSSProperties, type KeyboardEvent, type MouseEvent } from 'react';
import { defaultRangeExtractor, useVirtualizer, type Range } from '@tanstack/react-virtual';
import type { Gradebook, Score } from '../../engine/model';
import type { ScoreTokens } from '../../bridge/contract';
import { acceptedForms, formatScore, parseScore } from '../../engine/grading/parseScore';
import { formatPoints } from './cellView';
import {
  ASSESSMENT_WIDTH, FINAL_WIDTH, FIXED, HEADER_HEIGHT, ROW_HEIGHT, RosterRow, SECTION_WIDTH, STUDENT_WIDTH, type RowEditor,
} from './RosterRow';
import { rowWindow } from './rowWindow';

/** Rows kept in the DOM above and below the screen. */
const OVERSCAN_ROWS = 4;
/** Above this many assessments, columns are virtualised too. */
const COLUMN_VIRTUALISE_AT = 40;

/** The sizes above, for roster.css (one place: these constants). */
const SIZES = {
  '--wb-row-h': `${ROW_HEIGHT}px`,
  '--wb-student-w': `${STUDENT_WIDTH}px`,
  '--wb-section-w': `${SECTION_WIDTH}px`,
  '--wb-final-w': `${FINAL_WIDTH}px`,
  '--wb-assessment-w': `${ASSESSMENT_WIDTH}px`,
} as CSSProperties;

export interface RosterGridProps {
  gradebook: Gradebook;
  /** Student indices to show, in order. */
  rows: readonly number[];
  tokens: ScoreTokens;
  finalFor(studentId: string): number | null;
  /** The assessment ids dropped for a student (by gradebook index); the same set for the same student. */
  droppedFor(studentIndex: number): ReadonlySet<string>;
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

/** The cell a click landed on, from its `data-cell="row:col"`; null outside cells and in the editor. */
function cellAt(target: EventTarget): Active | null {
  if (!(target instanceof Element)) return null;
  const el = target.closest('[data-cell]');
  if (el === null || el.classList.contains('wb-cell-editing')) return null;
  const [r, c] = (el.getAttribute('data-cell') ?? '').split(':').map(Number);
  return r === undefined || c === undefined || !Number.isInteger(r) || !Number.isInteger(c) ? null : { row: r, col: c };
}

export function RosterGrid({ gradebook, rows, tokens, finalFor, droppedFor, onSetScore }: RosterGridProps) {
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

  // The row virtualiser gives the rows on screen; the overscan and the active row are added by
  // rowWindow (the overscan after the frame, see there).
  const rowVirtualizer = useVirtualizer({
    count: rowCount,
    getScrollElement: () => scrollRef.current,
    estimateSize: () => ROW_HEIGHT,
    overscan: 0,
    scrollPaddingStart: HEADER_HEIGHT,
  });
  // A stable range extractor: a new one each render would give the column virtualiser a new
  // window array each render, and every memoised row would re-render.
  const colRange = useMemo(() => withActive(col - FIXED), [col]);
  const virtualiseColumns = assessments.length > COLUMN_VIRTUALISE_AT;
  const colVirtualizer = useVirtualizer({
    horizontal: true,
    count: assessments.length,
    getScrollElement: () => scrollRef.current,
    estimateSize: () => ASSESSMENT_WIDTH,
    overscan: virtualiseColumns ? 2 : assessments.length,
    scrollPaddingStart: STUDENT_WIDTH + SECTION_WIDTH + FINAL_WIDTH,
    rangeExtractor: colRange,
  });

  rowVirtualizer.getVirtualItems(); // brings `range` (the rows on screen) up to date
  const first = rowVirtualizer.range?.startIndex ?? 0;
  const last = rowVirtualizer.range?.endIndex ?? -1;
  const settledFirst = useDeferredValue(first);
  const settledLast = useDeferredValue(last);
  // No overscan while the grid is being scrolled (the virtualiser's isScrolling: a scroll event in
  // the last 150 ms): every step of a long scroll would build rows the next step removes unseen.
  // It is added when the scroll stops, for small scrolls and keyboard moves.
  const overscan = rowVirtualizer.isScrolling ? 0 : OVERSCAN_ROWS;
  const shown = useMemo(
    () => rowWindow({ count: rowCount, first, last, settledFirst, settledLast, overscan, active: row }),
    [rowCount, first, last, settledFirst, settledLast, overscan, row],
  );
  const rowTop = (i: number) => rowVirtualizer.measurementsCache[i]?.start ?? i * ROW_HEIGHT;
  // The run's rows lie in normal flow under a top padding (no per-row inline style).
  const flowTop = shown.to >= shown.from ? rowTop(shown.from) : 0;
  const rowIndexes: number[] = [];
  for (let i = shown.from; i <= shown.to; i++) rowIndexes.push(i);
  if (shown.detached !== null) rowIndexes.push(shown.detached);
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

  // One click and one double-click handler for every cell (rows hold none).
  const onGridClick = (e: MouseEvent<HTMLDivElement>) => {
    const at = cellAt(e.target);
    if (at !== null) setActive(at);
  };
  const onGridDoubleClick = (e: MouseEvent<HTMLDivElement>) => {
    const at = cellAt(e.target);
    if (at !== null) startEdit(at.row, at.col);
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
  const editor: RowEditor | null = editing === null ? null : {
    col: editing.col,
    text: editing.text,
    error: editing.error,
    errorId,
    hint: acceptedForms(tokens),
    onChange: (e) => setEditing({ ...editing, text: e.target.value, error: null }),
    onKeyDown: onEditorKeyDown,
    onBlur: () => {
      // Leaving the field with a bad value keeps nothing: the old score stays.
      if (editing.error === null) commit();
    },
  };

  return (
    <div ref={scrollRef} className="wb-roster-scroll">
      <div
        role="grid"
        aria-label="Scores: students by assessments"
        aria-rowcount={rowCount + 1}
        aria-colcount={colCount}
        aria-readonly={false}
        className="wb-roster-grid"
        style={{ ...SIZES, width: totalWidth, height: HEADER_HEIGHT + rowVirtualizer.getTotalSize() }}
        onKeyDown={onGridKeyDown}
        onClick={onGridClick}
        onDoubleClick={onGridDoubleClick}
      >
        <div role="rowgroup" className="wb-roster-head" style={{ width: totalWidth, height: HEADER_HEIGHT }}>
          <div role="row" aria-rowindex={1} className="wb-roster-row wb-roster-head-row" style={{ height: HEADER_HEIGHT }}>
            <div className="wb-fixed-group">
              <div role="columnheader" aria-colindex={1} className="wb-cell wb-fixed wb-fixed-0">Student</div>
              <div role="columnheader" aria-colindex={2} className="wb-cell wb-fixed wb-fixed-1">Section</div>
              <div role="columnheader" aria-colindex={3} className="wb-cell wb-fixed wb-fixed-2 wb-num">Final</div>
            </div>
            <div aria-hidden="true" className="wb-col-spacer" style={{ width: firstColStart }} />
            {virtualCols.map((vc) => {
              const a = assessments[vc.index];
              if (a === undefined) return null;
              return (
                <div
                  key={a.id}
                  role="columnheader"
                  aria-colindex={FIXED + vc.index + 1}
                  className="wb-cell wb-num wb-assessment-head"
                  title={a.name}
                >
                  <span className="wb-head-name">{a.name}</span>
                  <span className="wb-head-possible">of {formatPoints(a.possible)}</span>
                </div>
              );
            })}
          </div>
        </div>
        <div role="rowgroup" className="wb-roster-body" style={{ paddingTop: flowTop }}>
          {rowIndexes.map((index) => {
            const studentIndex = rows[index];
            const student = studentIndex === undefined ? undefined : gradebook.students[studentIndex];
            if (studentIndex === undefined || student === undefined) return null;
            return (
              <RosterRow
                key={student.id}
                index={index}
                detachedTop={index === shown.detached ? rowTop(index) : null}
                student={student}
                scores={gradebook.scores[studentIndex]}
                dropped={droppedFor(studentIndex)}
                final={finalFor(student.id)}
                assessments={assessments}
                cols={virtualCols}
                firstColStart={firstColStart}
                activeCol={index === row ? col : -1}
                editor={editing !== null && editing.row === index ? editor : null}
              />
            );
          })}
        </div>
      </div>
      {rowCount === 0 && <p className="wb-roster-empty">No student matches the filter.</p>}
    </div>
  );
}

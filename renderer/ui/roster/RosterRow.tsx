/**
 * One student's row of the Roster grid. Memoised: a scroll render passes the same props to every
 * row that stays in view (same student, score row, dropped items, final, column window), so React
 * skips them and only builds the rows that scrolled in. Editing a score gives the row a new score
 * row (the store replaces it, undo brings the old one back) and a new final, so it re-renders.
 *
 * Clicks and double-clicks are handled once on the grid (RosterGrid), found by `data-cell`; a row
 * holds no per-cell handlers.
 */
import { memo, type ChangeEvent, type KeyboardEvent } from 'react';
import type { VirtualItem } from '@tanstack/react-virtual';
import type { Assessment, Score, Student } from '../../engine/model';
import { cellView, formatPoints } from './cellView';

export const ROW_HEIGHT = 34;
export const HEADER_HEIGHT = 58;
export const STUDENT_WIDTH = 220;
export const SECTION_WIDTH = 90;
export const FINAL_WIDTH = 80;
export const ASSESSMENT_WIDTH = 100;
/** Fixed (sticky) columns before the assessments: student, section, final. */
export const FIXED = 3;

/** The open inline editor, given only to the row that holds it. */
export interface RowEditor {
  readonly col: number;
  readonly text: string;
  readonly error: string | null;
  /** Id of the error message; `${errorId}-hint` is the accepted-forms hint. */
  readonly errorId: string;
  readonly hint: string;
  onChange(e: ChangeEvent<HTMLInputElement>): void;
  onKeyDown(e: KeyboardEvent<HTMLInputElement>): void;
  onBlur(): void;
}

export interface RosterRowProps {
  /** Position in the filtered roster (aria-rowindex is index + 2: the header is row 1). */
  readonly index: number;
  /**
   * Null for the rows of the scrolled window, which lie in normal flow below the body's top
   * padding (no per-row inline style); the row's top for the active row kept in the DOM while it
   * is scrolled out of the window (see RosterGrid).
   */
  readonly detachedTop: number | null;
  readonly student: Student;
  readonly scores: readonly Score[] | undefined;
  /** Assessment ids the drop-lowest rule left out for this student (droppedItems.ts). */
  readonly dropped: ReadonlySet<string>;
  readonly final: number | null;
  readonly assessments: readonly Assessment[];
  /** The assessment columns in the DOM (the column virtualiser's window). */
  readonly cols: readonly VirtualItem[];
  readonly firstColStart: number;
  /** The column holding the grid's single tab stop when this is the active row, else -1. */
  readonly activeCol: number;
  readonly editor: RowEditor | null;
}

export const RosterRow = memo(function RosterRow(p: RosterRowProps) {
  const { index, student, editor } = p;
  const tab = (c: number) => (c === p.activeCol ? 0 : -1);
  return (
    <div
      role="row"
      aria-rowindex={index + 2}
      className={`wb-roster-row${index % 2 === 1 ? ' wb-row-odd' : ''}${editor !== null ? ' wb-row-editing' : ''}${p.detachedTop !== null ? ' wb-row-detached' : ''}`}
      style={p.detachedTop === null ? undefined : { transform: `translateY(${HEADER_HEIGHT + p.detachedTop}px)` }}
    >
      {/* One sticky block for the fixed columns (one sticky box per row, not three). */}
      <div className="wb-fixed-group">
        <div role="rowheader" aria-colindex={1} className="wb-cell wb-fixed wb-fixed-0 wb-student" data-cell={`${index}:0`} tabIndex={tab(0)}>
          <span className="wb-student-name">{student.name}</span>
          <span className="wb-student-id">{student.id}</span>
        </div>
        <div role="gridcell" aria-colindex={2} aria-readonly={true} className="wb-cell wb-fixed wb-fixed-1" data-cell={`${index}:1`} tabIndex={tab(1)}>
          {student.section}
        </div>
        <div
          role="gridcell"
          aria-colindex={3}
          aria-readonly={true}
          className="wb-cell wb-fixed wb-fixed-2 wb-num wb-final"
          data-cell={`${index}:2`}
          tabIndex={tab(2)}
          aria-label={p.final === null ? 'no final mark' : `final ${p.final} %`}
          data-final={p.final === null ? '' : String(p.final)}
        >
          {p.final === null ? 'no mark' : `${p.final}`}
        </div>
      </div>
      <div aria-hidden="true" className="wb-col-spacer" style={{ width: p.firstColStart }} />
      {p.cols.map((vc) => {
        const a = p.assessments[vc.index];
        if (a === undefined) return null;
        const c = FIXED + vc.index;
        if (editor !== null && editor.col === c) {
          return (
            <div key={a.id} role="gridcell" aria-colindex={c + 1} className="wb-cell wb-num wb-cell-editing" data-cell={`${index}:${c}`}>
              <input
                autoFocus
                className="wb-cell-input"
                aria-label={`Score for ${student.name}, ${a.name}, of ${formatPoints(a.possible)} points`}
                aria-invalid={editor.error !== null}
                aria-describedby={editor.error !== null ? editor.errorId : `${editor.errorId}-hint`}
                value={editor.text}
                onChange={editor.onChange}
                onKeyDown={editor.onKeyDown}
                onBlur={editor.onBlur}
              />
              <span id={`${editor.errorId}-hint`} className="wb-visually-hidden">{editor.hint}</span>
              {editor.error !== null && (
                <span id={editor.errorId} className="wb-cell-error" role="alert">
                  Not changed: {editor.error}
                </span>
              )}
            </div>
          );
        }
        const view = cellView(p.scores?.[vc.index], a.possible, p.dropped.has(a.id));
        return (
          <div
            key={a.id}
            role="gridcell"
            aria-colindex={c + 1}
            aria-label={view.label}
            className={`wb-cell wb-num wb-score wb-cell-${view.state}${view.dropped ? ' wb-cell-dropped' : ''}`}
            data-cell={`${index}:${c}`}
            tabIndex={tab(c)}
          >
            {view.dropped ? <><s>{view.text}</s><span aria-hidden="true">↓</span></> : view.text}
          </div>
        );
      })}
    </div>
  );
});

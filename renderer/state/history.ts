/**
 * The course's edit history: every change to the open course goes through `historyReducer`, so
 * undo/redo, the dirty flag and autosave all see the same sequence of snapshots.
 *
 * Snapshots share structure: an edit copies only the path it changes (a score edit copies one row
 * and the outer grid, never the other rows), so 200 snapshots of a 10 000-student course cost a
 * few row copies each, not 200 copies of the course.
 */
import type { Gradebook, GradingPlan, Score } from '../engine/model';
import type { CourseProject } from '../bridge/contract';

export type Edit =
  | { kind: 'setScore'; studentIndex: number; assessmentIndex: number; score: Score }
  | { kind: 'updatePlan'; label: string; plan: GradingPlan }
  | { kind: 'updateGradebook'; label: string; gradebook: Gradebook }
  | { kind: 'replaceProject'; label: string; project: CourseProject };

/** A past or future state, with the label of the edit that leads from it to its neighbour. */
interface Step {
  readonly snapshot: Snapshot;
  readonly label: string;
}

interface Snapshot {
  readonly project: CourseProject;
  /** Distinct per snapshot; compared with `savedRevision` to know whether there are unsaved changes. */
  readonly revision: number;
}

export interface HistoryState {
  readonly present: Snapshot | null;
  readonly past: readonly Step[];
  readonly future: readonly Step[];
  readonly projectPath: string | null;
  /** Revision that matches the file on disk; null when the course was never saved (or restored unsaved). */
  readonly savedRevision: number | null;
  readonly nextRevision: number;
  readonly limit: number;
}

export type HistoryAction =
  | { type: 'apply'; edit: Edit }
  | { type: 'undo' }
  | { type: 'redo' }
  /** Start a fresh history. `dirty`: the course differs from any file (a restored recovery copy, a new import). */
  | { type: 'open'; project: CourseProject; path: string | null; dirty?: boolean }
  | { type: 'markSaved'; path: string };

/** Default bound on undo steps: enough for a session, small enough to keep memory flat. */
export const DEFAULT_HISTORY_LIMIT = 200;

export function initialHistory(limit: number = DEFAULT_HISTORY_LIMIT): HistoryState {
  return { present: null, past: [], future: [], projectPath: null, savedRevision: null, nextRevision: 1, limit };
}

function sameScore(a: Score | undefined, b: Score): boolean {
  if (a === undefined || a.kind !== b.kind) return false;
  return a.kind !== 'earned' || (b.kind === 'earned' && Object.is(a.points, b.points));
}

/**
 * The project after `edit`, or the same object when the edit changes nothing (so no undo step is
 * recorded for it). Throws RangeError on an index outside the grid: that is a caller bug, never a
 * user error, and must not silently create a ragged grid.
 */
export function applyEdit(project: CourseProject, edit: Edit): CourseProject {
  switch (edit.kind) {
    case 'setScore': {
      const { gradebook } = project;
      const row = gradebook.scores[edit.studentIndex];
      if (row === undefined || edit.assessmentIndex < 0 || edit.assessmentIndex >= gradebook.assessments.length || !Number.isInteger(edit.assessmentIndex)) {
        throw new RangeError(`setScore: no cell at student ${edit.studentIndex}, assessment ${edit.assessmentIndex}`);
      }
      if (sameScore(row[edit.assessmentIndex], edit.score)) return project;
      const newRow = row.slice();
      newRow[edit.assessmentIndex] = edit.score;
      const scores = gradebook.scores.slice();
      scores[edit.studentIndex] = newRow;
      return { ...project, gradebook: { ...gradebook, scores } };
    }
    case 'updatePlan':
      return edit.plan === project.plan ? project : { ...project, plan: edit.plan };
    case 'updateGradebook':
      return edit.gradebook === project.gradebook ? project : { ...project, gradebook: edit.gradebook };
    case 'replaceProject':
      return edit.project;
  }
}

/** The words shown on the undo/redo buttons ("Undo edit score: Ada Moss, Quiz 1"). */
export function describeEdit(project: CourseProject, edit: Edit): string {
  if (edit.kind !== 'setScore') return edit.label;
  const student = project.gradebook.students[edit.studentIndex];
  const assessment = project.gradebook.assessments[edit.assessmentIndex];
  return `Edit score: ${student?.name ?? '?'}, ${assessment?.name ?? '?'}`;
}

export function historyReducer(state: HistoryState, action: HistoryAction): HistoryState {
  switch (action.type) {
    case 'open': {
      const revision = state.nextRevision;
      return {
        ...state,
        present: { project: action.project, revision },
        past: [],
        future: [],
        projectPath: action.path,
        savedRevision: action.dirty === true ? null : revision,
        nextRevision: revision + 1,
      };
    }
    case 'apply': {
      const present = state.present;
      if (present === null) return state;
      const project = applyEdit(present.project, action.edit);
      if (project === present.project) return state;
      const label = describeEdit(present.project, action.edit);
      const past = [...state.past, { snapshot: present, label }];
      if (past.length > state.limit) past.splice(0, past.length - state.limit);
      return {
        ...state,
        present: { project, revision: state.nextRevision },
        past,
        future: [],
        nextRevision: state.nextRevision + 1,
      };
    }
    case 'undo': {
      const step = state.past.at(-1);
      if (step === undefined || state.present === null) return state;
      return {
        ...state,
        present: step.snapshot,
        past: state.past.slice(0, -1),
        future: [{ snapshot: state.present, label: step.label }, ...state.future],
      };
    }
    case 'redo': {
      const [step, ...rest] = state.future;
      if (step === undefined || state.present === null) return state;
      return {
        ...state,
        present: step.snapshot,
        past: [...state.past, { snapshot: state.present, label: step.label }],
        future: rest,
      };
    }
    case 'markSaved':
      if (state.present === null) return state;
      return { ...state, projectPath: action.path, savedRevision: state.present.revision };
  }
}

export function isDirty(state: HistoryState): boolean {
  return state.present !== null && state.present.revision !== state.savedRevision;
}

export function undoLabel(state: HistoryState): string | null {
  return state.past.at(-1)?.label ?? null;
}

export function redoLabel(state: HistoryState): string | null {
  return state.future[0]?.label ?? null;
}

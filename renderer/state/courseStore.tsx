/**
 * The open course and its history, for every workspace. All changes go through `apply` (or
 * `open`), never through local copies, so undo/redo, the dirty flag and autosave see each one.
 */
import { createContext, useCallback, useContext, useEffect, useMemo, useReducer, useRef, useState, type ReactNode } from 'react';
import type { CourseProject } from '../bridge/contract';
import { useBridge } from '../bridge/BridgeContext';
import type { CourseResult } from '../engine/grading/gradeCourse';
import { CourseGrading } from './courseGrading';
import { projectJsonSteps } from './projectJson';
import { QuietTimer } from './quietTimer';
import { runInSlices } from './slices';
import {
  DEFAULT_HISTORY_LIMIT,
  historyReducer,
  initialHistory,
  isDirty,
  redoLabel,
  undoLabel,
  type Edit,
} from './history';

export type { Edit } from './history';

export type { CourseResult } from '../engine/grading/gradeCourse';

export interface CourseStore {
  readonly project: CourseProject | null;
  readonly projectPath: string | null;
  /**
   * gradeCourse(project.gradebook, project.plan), recomputed only when either changes — on the
   * fast path, incrementally after a weight or score edit (courseGrading.ts). Each student's
   * explanation `lines` (and effective weights) are computed when first read, so only the students
   * a screen shows pay for them.
   */
  readonly results: CourseResult | null;
  readonly dirty: boolean;
  apply(edit: Edit): void;
  undo(): void;
  redo(): void;
  readonly canUndo: boolean;
  readonly canRedo: boolean;
  readonly undoLabel: string | null;
  readonly redoLabel: string | null;
  /** Start a fresh history on `project`. `options.dirty`: it is not what is on disk (restored recovery copy). */
  open(project: CourseProject, path: string | null, options?: { dirty?: boolean }): void;
  markSaved(path: string): void;
  /** When the last autosave to the recovery copy finished, or null. */
  readonly lastAutosave: string | null;
}

const CourseStoreContext = createContext<CourseStore | null>(null);

/** Quiet period (no change, no input) before the recovery copy is written. */
export const AUTOSAVE_DELAY_MS = 2000;
/** The recovery copy is never older than this after a change, however busy the user is. */
export const AUTOSAVE_MAX_DELAY_MS = 30_000;
/** Longest task of the recovery copy's serialisation. */
const SERIALISE_SLICE_MS = 8;

export function CourseStoreProvider({ children, historyLimit = DEFAULT_HISTORY_LIMIT }: { children: ReactNode; historyLimit?: number }) {
  const bridge = useBridge();
  const [state, dispatch] = useReducer(historyReducer, historyLimit, initialHistory);
  const [lastAutosave, setLastAutosave] = useState<string | null>(null);

  const project = state.present?.project ?? null;
  const dirty = isDirty(state);
  const projectPath = state.projectPath;

  const gradebook = project?.gradebook;
  const plan = project?.plan;
  const grading = useRef<CourseGrading | null>(null);
  const results = useMemo<CourseResult | null>(() => {
    if (gradebook === undefined || plan === undefined) return null;
    grading.current ??= new CourseGrading();
    return grading.current.grade(gradebook, plan);
  }, [gradebook, plan]); // the two parts the engine reads: a title edit does not regrade

  // Autosave: a recovery copy of every change that is not on disk, written when the user pauses
  // (quietTimer.ts: no change and no input for AUTOSAVE_DELAY_MS, at the latest AUTOSAVE_MAX_DELAY_MS
  // after the first unsaved change). The latest course is read when the timer fires.
  const latest = useRef({ project, projectPath });
  latest.current = { project, projectPath };
  const autosave = useRef<QuietTimer | null>(null);
  // The course is serialised in slices (projectJson.ts), so even a large one never stalls the page.
  const serialising = useRef<(() => void) | null>(null);
  autosave.current ??= new QuietTimer(
    () => {
      const { project: p, projectPath: path } = latest.current;
      if (p === null) return;
      serialising.current?.();
      serialising.current = runInSlices(
        () => projectJsonSteps(p),
        (json) => {
          serialising.current = null;
          void bridge.writeRecovery(path, json).then((r) => {
            if (r.ok) setLastAutosave(r.value.savedAt);
          });
        },
        SERIALISE_SLICE_MS,
      );
    },
    AUTOSAVE_DELAY_MS,
    AUTOSAVE_MAX_DELAY_MS,
  );
  useEffect(() => {
    if (project === null || !dirty) autosave.current?.cancel();
    else autosave.current?.change();
  }, [project, projectPath, dirty]);
  useEffect(() => {
    const timer = autosave.current;
    const input = (): void => timer?.activity();
    const kinds = ['keydown', 'wheel', 'pointerdown'] as const;
    for (const kind of kinds) window.addEventListener(kind, input, { passive: true, capture: true });
    return () => {
      for (const kind of kinds) window.removeEventListener(kind, input, { capture: true });
      timer?.cancel();
      serialising.current?.();
    };
  }, []);

  // Tell the shell (when there is one) so closing the window can ask about unsaved changes.
  useEffect(() => {
    void bridge.setDirty?.(dirty);
  }, [bridge, dirty]);

  const apply = useCallback((edit: Edit) => {
    performance.mark('wb:edit-applied'); // for bench/renderer.ts (edit → paint); no behaviour
    dispatch({ type: 'apply', edit });
  }, []);
  const undo = useCallback(() => dispatch({ type: 'undo' }), []);
  const redo = useCallback(() => dispatch({ type: 'redo' }), []);
  const open = useCallback(
    (p: CourseProject, path: string | null, options?: { dirty?: boolean }) =>
      dispatch({ type: 'open', project: p, path, dirty: options?.dirty === true }),
    [],
  );
  const markSaved = useCallback(
    (path: string) => {
      dispatch({ type: 'markSaved', path });
      // The project file now holds the work; an old recovery copy would only confuse the next start.
      void bridge.discardRecovery();
    },
    [bridge],
  );

  const value = useMemo<CourseStore>(
    () => ({
      project,
      projectPath,
      results,
      dirty,
      apply,
      undo,
      redo,
      canUndo: state.past.length > 0,
      canRedo: state.future.length > 0,
      undoLabel: undoLabel(state),
      redoLabel: redoLabel(state),
      open,
      markSaved,
      lastAutosave,
    }),
    [state, project, projectPath, results, dirty, apply, undo, redo, open, markSaved, lastAutosave],
  );

  return <CourseStoreContext.Provider value={value}>{children}</CourseStoreContext.Provider>;
}

export function useCourseStore(): CourseStore {
  const store = useContext(CourseStoreContext);
  if (store === null) throw new Error('useCourseStore() needs a <CourseStoreProvider> above it');
  return store;
}

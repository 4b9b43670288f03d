// The edit history: the laws undo/redo must obey (undo inverts apply, redo inverts undo, a new
// edit clears redo), the bound, structural sharing and the dirty flag. These are properties of
// the reducer itself (common practice for undo stacks, no source); the data is generated.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { CourseProject } from '../../renderer/bridge/contract';
import type { GradingPlan, Score } from '../../renderer/engine/model';
import {
  applyEdit,
  historyReducer,
  initialHistory,
  isDirty,
  redoLabel,
  undoLabel,
  type Edit,
  type HistoryState,
} from '../../renderer/state/history';

const plan: GradingPlan = {
  categories: [{ id: 'quizzes', name: 'Quizzes', weight: 100, combine: 'totalPoints', dropLowest: 0, missingAs: 'zero', capPercent: null, droppedForCourse: false }],
  items: { q1: { categoryId: 'quizzes', extraCredit: false }, q2: { categoryId: 'quizzes', extraCredit: false } },
  sectionWaivers: [],
  studentWaivers: [],
  markMode: 'current',
  scale: { name: 'Pass/fail', cutoffs: [{ letter: 'P', minPercent: 50 }, { letter: 'F', minPercent: 0 }] },
  rounding: { decimals: 0 },
  adjustments: [],
};

function course(students: number): CourseProject {
  return {
    title: 'Test course',
    notes: '',
    source: null,
    plan,
    gradebook: {
      students: Array.from({ length: students }, (_, i) => ({ id: `s${i}`, name: `Student ${i}`, section: 'A' })),
      assessments: [
        { id: 'q1', name: 'Quiz 1', possible: 10 },
        { id: 'q2', name: 'Quiz 2', possible: 10 },
      ],
      scores: Array.from({ length: students }, () => [{ kind: 'earned', points: 5 }, { kind: 'missing' }] as Score[]),
    },
  };
}

const scoreArb: fc.Arbitrary<Score> = fc.oneof(
  fc.integer({ min: 0, max: 10 }).map((points): Score => ({ kind: 'earned', points })),
  fc.constantFrom<Score>({ kind: 'missing' }, { kind: 'excused' }, { kind: 'pending' }),
);

const editArb = (students: number): fc.Arbitrary<Edit> =>
  fc.record({
    kind: fc.constant('setScore' as const),
    studentIndex: fc.integer({ min: 0, max: students - 1 }),
    assessmentIndex: fc.integer({ min: 0, max: 1 }),
    score: scoreArb,
  });

function opened(project: CourseProject, limit?: number): HistoryState {
  return historyReducer(initialHistory(limit), { type: 'open', project, path: '/tmp/x.weighbridge' });
}

function run(state: HistoryState, edits: readonly Edit[]): HistoryState {
  return edits.reduce((s, edit) => historyReducer(s, { type: 'apply', edit }), state);
}

describe('historyReducer', () => {
  it('undoing every applied edit returns the opened project, and redoing all returns the last one', () => {
    fc.assert(
      fc.property(fc.array(editArb(4), { maxLength: 30 }), (edits) => {
        const start = opened(course(4));
        const end = run(start, edits);
        let s = end;
        for (let i = 0; i < end.past.length; i++) s = historyReducer(s, { type: 'undo' });
        expect(s.present?.project).toEqual(start.present?.project);
        expect(s.past).toHaveLength(0);
        for (let i = 0; i < end.past.length; i++) s = historyReducer(s, { type: 'redo' });
        expect(s.present?.project).toEqual(end.present?.project);
        expect(s.future).toHaveLength(0);
      }),
    );
  });

  it('a new edit after undo discards the redo steps', () => {
    const s1 = run(opened(course(2)), [
      { kind: 'setScore', studentIndex: 0, assessmentIndex: 0, score: { kind: 'earned', points: 9 } },
      { kind: 'setScore', studentIndex: 1, assessmentIndex: 1, score: { kind: 'excused' } },
    ]);
    const undone = historyReducer(s1, { type: 'undo' });
    expect(undone.future).toHaveLength(1);
    const edited = run(undone, [{ kind: 'setScore', studentIndex: 1, assessmentIndex: 0, score: { kind: 'pending' } }]);
    expect(edited.future).toHaveLength(0);
    expect(historyReducer(edited, { type: 'redo' })).toBe(edited);
  });

  it('an edit that changes nothing records no undo step', () => {
    const s = opened(course(2));
    const same = run(s, [{ kind: 'setScore', studentIndex: 0, assessmentIndex: 0, score: { kind: 'earned', points: 5 } }]);
    expect(same).toBe(s);
    expect(same.past).toHaveLength(0);
  });

  it('keeps at most `limit` undo steps, dropping the oldest', () => {
    const edits: Edit[] = Array.from({ length: 12 }, (_, i) => ({
      kind: 'setScore',
      studentIndex: 0,
      assessmentIndex: 0,
      score: { kind: 'earned', points: i % 2 === 0 ? 1 : 2 },
    }));
    const s = run(opened(course(1), 5), edits);
    expect(s.past).toHaveLength(5);
    let u = s;
    for (let i = 0; i < 10; i++) u = historyReducer(u, { type: 'undo' });
    // Five steps back from the 12th edit is the state after the 7th edit (points 1, index 6).
    expect(u.present?.project.gradebook.scores[0]?.[0]).toEqual({ kind: 'earned', points: 1 });
    expect(u.past).toHaveLength(0);
  });

  it('a score edit copies only the changed row; other rows, students and the plan are shared', () => {
    const before = course(50);
    const after = applyEdit(before, { kind: 'setScore', studentIndex: 7, assessmentIndex: 1, score: { kind: 'earned', points: 8 } });
    expect(after.gradebook.scores[7]).toEqual([{ kind: 'earned', points: 5 }, { kind: 'earned', points: 8 }]);
    expect(before.gradebook.scores[7]?.[1]).toEqual({ kind: 'missing' });
    for (let i = 0; i < 50; i++) if (i !== 7) expect(after.gradebook.scores[i]).toBe(before.gradebook.scores[i]);
    expect(after.gradebook.students).toBe(before.gradebook.students);
    expect(after.gradebook.assessments).toBe(before.gradebook.assessments);
    expect(after.plan).toBe(before.plan);
  });

  it('refuses a cell outside the grid instead of growing a ragged row', () => {
    const p = course(2);
    expect(() => applyEdit(p, { kind: 'setScore', studentIndex: 2, assessmentIndex: 0, score: { kind: 'missing' } })).toThrow(RangeError);
    expect(() => applyEdit(p, { kind: 'setScore', studentIndex: 0, assessmentIndex: 2, score: { kind: 'missing' } })).toThrow(RangeError);
    expect(() => applyEdit(p, { kind: 'setScore', studentIndex: -1, assessmentIndex: 0, score: { kind: 'missing' } })).toThrow(RangeError);
  });

  it('labels steps for the undo and redo buttons', () => {
    const planEdit: Edit = { kind: 'updatePlan', label: 'Change weights', plan: { ...plan, markMode: 'projected' } };
    const s = run(opened(course(2)), [
      { kind: 'setScore', studentIndex: 1, assessmentIndex: 0, score: { kind: 'excused' } },
      planEdit,
    ]);
    expect(undoLabel(s)).toBe('Change weights');
    const u = historyReducer(s, { type: 'undo' });
    expect(undoLabel(u)).toBe('Edit score: Student 1, Quiz 1');
    expect(redoLabel(u)).toBe('Change weights');
  });

  it('is dirty after an edit, clean after saving, dirty again after undoing past the save', () => {
    let s = opened(course(2));
    expect(isDirty(s)).toBe(false);
    s = run(s, [{ kind: 'updateGradebook', label: 'Rename', gradebook: { ...course(1).gradebook } }]);
    expect(isDirty(s)).toBe(true);
    s = historyReducer(s, { type: 'markSaved', path: '/tmp/y.weighbridge' });
    expect(isDirty(s)).toBe(false);
    expect(s.projectPath).toBe('/tmp/y.weighbridge');
    s = historyReducer(s, { type: 'undo' });
    expect(isDirty(s)).toBe(true);
    s = historyReducer(s, { type: 'redo' });
    expect(isDirty(s)).toBe(false);
  });

  it('a course opened as restored work is dirty and has no history', () => {
    const s = historyReducer(opened(course(1)), { type: 'open', project: course(3), path: null, dirty: true });
    expect(isDirty(s)).toBe(true);
    expect(s.past).toHaveLength(0);
    expect(s.projectPath).toBeNull();
  });

  it('replaceProject is one undoable step', () => {
    const first = course(2);
    const replacement = { ...course(5), title: 'Imported' };
    const s = run(opened(first), [{ kind: 'replaceProject', label: 'Import marks.xlsx', project: replacement }]);
    expect(s.present?.project).toBe(replacement);
    expect(historyReducer(s, { type: 'undo' }).present?.project).toBe(first);
  });

  it('does nothing without an open course', () => {
    const s = initialHistory();
    expect(historyReducer(s, { type: 'undo' })).toBe(s);
    expect(historyReducer(s, { type: 'apply', edit: { kind: 'setScore', studentIndex: 0, assessmentIndex: 0, score: { kind: 'missing' } } })).toBe(s);
    expect(isDirty(s)).toBe(false);
  });
});

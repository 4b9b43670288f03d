/**
 * Re-import: what a newer export of the same course changes, by student ID and assessment ID.
 *
 * - Students in the new file only: added, with their scores. Students in the project only:
 *   reported as missing and KEPT with every score they had (withdrawals are the user's call).
 * - Assessments in the new file only: added (no category — the plan is kept exactly as it was, so
 *   a new assessment is not graded until the user places it). Assessments in the project only are
 *   kept. A student with no cell for an assessment (added student × old assessment, kept student ×
 *   new assessment) gets `pending`: neither a zero nor a silent excuse.
 * - A score that differs is listed in `changedScores` and the merged project carries the new value;
 *   so does a changed name/section/e-mail (`changedStudents`; a blank in the new file keeps the old
 *   value) and a changed points possible (`changedPossible`). Nothing changes that is not listed.
 */
import type { CourseProject, MergePreview } from '../../../renderer/bridge/contract';
import type { Assessment, Gradebook, Score, Student } from '../../../renderer/engine/model';

export interface MergeDetails extends MergePreview {
  readonly changedStudents: readonly {
    readonly id: string;
    readonly field: 'name' | 'section' | 'email';
    readonly before: string;
    readonly after: string;
  }[];
  readonly changedPossible: readonly { readonly assessmentId: string; readonly before: number; readonly after: number }[];
}

const PENDING: Score = { kind: 'pending' };

export function previewMergeBooks(current: CourseProject, incoming: Gradebook): MergeDetails {
  const old = current.gradebook;
  const oldStudentIndex = indexBy(old.students.map((s) => s.id));
  const newStudentIndex = indexBy(incoming.students.map((s) => s.id));
  const newAssessmentIndex = indexBy(incoming.assessments.map((a) => a.id));
  const oldAssessmentIndex = indexBy(old.assessments.map((a) => a.id));

  const changedPossible: { assessmentId: string; before: number; after: number }[] = [];
  const assessments: Assessment[] = old.assessments.map((a) => {
    const j = newAssessmentIndex.get(a.id);
    const next = j === undefined ? undefined : incoming.assessments[j];
    if (next === undefined || next.possible === a.possible) return a;
    changedPossible.push({ assessmentId: a.id, before: a.possible, after: next.possible });
    return { ...a, possible: next.possible };
  });
  const addedAssessments: string[] = [];
  for (const a of incoming.assessments) {
    if (oldAssessmentIndex.has(a.id)) continue;
    addedAssessments.push(a.id);
    assessments.push(a);
  }
  // Where each merged assessment's score comes from, in the old and the new gradebook.
  const fromOld = assessments.map((a) => oldAssessmentIndex.get(a.id));
  const fromNew = assessments.map((a) => newAssessmentIndex.get(a.id));

  const students: Student[] = [];
  const scores: Score[][] = [];
  const changedScores: MergePreview['changedScores'][number][] = [];
  const changedStudents: MergeDetails['changedStudents'][number][] = [];
  const missingStudents: MergePreview['missingStudents'][number][] = [];

  old.students.forEach((s, i) => {
    const j = newStudentIndex.get(s.id);
    const next = j === undefined ? undefined : incoming.students[j];
    const oldRow = old.scores[i] ?? [];
    const newRow = j === undefined ? undefined : incoming.scores[j];
    if (next === undefined || newRow === undefined) {
      missingStudents.push({ id: s.id, name: s.name, section: s.section });
      students.push(s);
      scores.push(assessments.map((_, k) => pick(oldRow, fromOld[k]) ?? PENDING));
      return;
    }
    students.push(mergeStudent(s, next, changedStudents));
    scores.push(
      assessments.map((a, k) => {
        const before = pick(oldRow, fromOld[k]);
        const after = pick(newRow, fromNew[k]);
        if (after === undefined) return before ?? PENDING;
        if (before !== undefined && !sameScore(before, after)) {
          changedScores.push({ studentId: s.id, assessmentId: a.id, before: scoreWords(before), after: scoreWords(after) });
        }
        return after;
      }),
    );
  });

  const addedStudents: MergePreview['addedStudents'][number][] = [];
  incoming.students.forEach((s, j) => {
    if (oldStudentIndex.has(s.id)) return;
    addedStudents.push({ id: s.id, name: s.name, section: s.section });
    students.push(s);
    const newRow = incoming.scores[j] ?? [];
    scores.push(assessments.map((_, k) => pick(newRow, fromNew[k]) ?? PENDING));
  });

  return {
    addedStudents,
    missingStudents,
    addedAssessments,
    changedScores,
    changedStudents,
    changedPossible,
    merged: { ...current, gradebook: { students, assessments, scores } },
  };
}

/** How a score reads in the review list: the points, or the state's word. */
export function scoreWords(s: Score): string {
  return s.kind === 'earned' ? String(s.points) : s.kind;
}

function sameScore(a: Score, b: Score): boolean {
  if (a.kind === 'earned' && b.kind === 'earned') return a.points === b.points;
  return a.kind === b.kind;
}

function mergeStudent(before: Student, after: Student, changes: MergeDetails['changedStudents'][number][]): Student {
  // A blank in the new file (a column not exported this time) keeps the old value.
  const take = (field: 'name' | 'section' | 'email'): string => {
    const b = before[field] ?? '';
    const a = after[field] ?? '';
    if (a === '' || a === b) return b;
    changes.push({ id: before.id, field, before: b, after: a });
    return a;
  };
  const name = take('name');
  const section = take('section');
  const email = take('email');
  return email === '' ? { id: before.id, name, section } : { id: before.id, name, section, email };
}

function pick(row: readonly Score[], index: number | undefined): Score | undefined {
  return index === undefined ? undefined : row[index];
}

function indexBy(keys: readonly string[]): Map<string, number> {
  const map = new Map<string, number>();
  keys.forEach((k, i) => {
    if (!map.has(k)) map.set(k, i);
  });
  return map;
}

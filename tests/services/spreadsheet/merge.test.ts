import { describe, expect, it } from 'vitest';
import type { CourseProject } from '../../../renderer/bridge/contract';
import type { Gradebook, GradingPlan } from '../../../renderer/engine/model';
import { DEFAULT_TOKENS } from '../../../renderer/engine/grading/parseScore';
import { detectAndImport, previewMerge, previewMergeBooks } from '../../../main/services/spreadsheet';
import { tempDir, workbookBytes, writeTemp } from './fixtures';

const PLAN: GradingPlan = {
  categories: [{ id: 'quizzes', name: 'Quizzes', weight: 100, combine: 'totalPoints', dropLowest: 0, missingAs: 'zero', capPercent: null, droppedForCourse: false }],
  items: { Q1: { categoryId: 'quizzes', extraCredit: false }, Q2: { categoryId: 'quizzes', extraCredit: false } },
  sectionWaivers: [],
  studentWaivers: [],
  markMode: 'current',
  scale: { name: 'Pass/fail', cutoffs: [{ letter: 'P', minPercent: 50 }, { letter: 'F', minPercent: 0 }] },
  rounding: { decimals: 0 },
  adjustments: [],
};

const OLD: Gradebook = {
  students: [
    { id: '1', name: 'Ann', section: 'A', email: 'ann@example.edu' },
    { id: '2', name: 'Bo', section: 'A' },
    { id: '3', name: 'Cy', section: 'B' },
  ],
  assessments: [
    { id: 'Q1', name: 'Q1', possible: 10 },
    { id: 'Q2', name: 'Q2', possible: 10 },
  ],
  scores: [
    [{ kind: 'earned', points: 8 }, { kind: 'pending' }],
    [{ kind: 'earned', points: 6 }, { kind: 'pending' }],
    [{ kind: 'excused' }, { kind: 'pending' }],
  ],
};

const PROJECT: CourseProject = { title: 'Course', gradebook: OLD, plan: PLAN, source: null, notes: 'keep me' };

// The newer export: Cy withdrew, Di joined, Q2 now marked, Q3 new, Bo's Q1 regraded, Ann moved section.
const NEW: Gradebook = {
  students: [
    { id: '1', name: 'Ann', section: 'B' },
    { id: '2', name: 'Bo', section: 'A' },
    { id: '4', name: 'Di', section: 'B' },
  ],
  assessments: [
    { id: 'Q1', name: 'Q1', possible: 10 },
    { id: 'Q2', name: 'Q2', possible: 10 },
    { id: 'Q3', name: 'Q3', possible: 5 },
  ],
  scores: [
    [{ kind: 'earned', points: 8 }, { kind: 'earned', points: 9 }, { kind: 'earned', points: 4 }],
    [{ kind: 'earned', points: 7 }, { kind: 'missing' }, { kind: 'earned', points: 5 }],
    [{ kind: 'earned', points: 10 }, { kind: 'earned', points: 10 }, { kind: 'excused' }],
  ],
};

describe('re-import merge preview', () => {
  const m = previewMergeBooks(PROJECT, NEW);

  it('lists added and missing students; missing ones are kept with their scores', () => {
    expect(m.addedStudents).toEqual([{ id: '4', name: 'Di', section: 'B' }]);
    expect(m.missingStudents).toEqual([{ id: '3', name: 'Cy', section: 'B' }]);
    expect(m.merged.gradebook.students.map((s) => s.id)).toEqual(['1', '2', '3', '4']);
    expect(m.merged.gradebook.scores[2]).toEqual([{ kind: 'excused' }, { kind: 'pending' }, { kind: 'pending' }]);
  });

  it('adds new assessments without touching the plan', () => {
    expect(m.addedAssessments).toEqual(['Q3']);
    expect(m.merged.gradebook.assessments.map((a) => a.id)).toEqual(['Q1', 'Q2', 'Q3']);
    expect(m.merged.plan).toBe(PLAN);
    expect(Object.keys(m.merged.plan.items)).toEqual(['Q1', 'Q2']);
    expect(m.merged.notes).toBe('keep me');
  });

  it('lists every changed score, and the merged course carries exactly those changes', () => {
    expect(m.changedScores).toEqual([
      { studentId: '1', assessmentId: 'Q2', before: 'pending', after: '9' },
      { studentId: '2', assessmentId: 'Q1', before: '6', after: '7' },
      { studentId: '2', assessmentId: 'Q2', before: 'pending', after: 'missing' },
    ]);
    // Every merged cell is either the old score or a listed change (or a new column / new student).
    const listed = new Set(m.changedScores.map((c) => `${c.studentId}|${c.assessmentId}`));
    m.merged.gradebook.students.forEach((s, i) => {
      OLD.assessments.forEach((a, k) => {
        const oi = OLD.students.findIndex((o) => o.id === s.id);
        if (oi < 0 || listed.has(`${s.id}|${a.id}`)) return;
        expect(m.merged.gradebook.scores[i]?.[k]).toEqual(OLD.scores[oi]?.[k]);
      });
    });
    expect(m.merged.gradebook.scores[0]).toEqual([{ kind: 'earned', points: 8 }, { kind: 'earned', points: 9 }, { kind: 'earned', points: 4 }]);
  });

  it('lists changed student details; a blank in the new file keeps the old value', () => {
    expect(m.changedStudents).toEqual([{ id: '1', field: 'section', before: 'A', after: 'B' }]);
    expect(m.merged.gradebook.students[0]).toEqual({ id: '1', name: 'Ann', section: 'B', email: 'ann@example.edu' });
  });

  it('lists a changed points possible', () => {
    const more: Gradebook = { ...NEW, assessments: NEW.assessments.map((a) => (a.id === 'Q1' ? { ...a, possible: 12 } : a)) };
    const r = previewMergeBooks(PROJECT, more);
    expect(r.changedPossible).toEqual([{ assessmentId: 'Q1', before: 10, after: 12 }]);
  });

  it('merging the same gradebook changes nothing', () => {
    const same = previewMergeBooks(PROJECT, OLD);
    expect([same.addedStudents, same.missingStudents, same.addedAssessments, same.changedScores, same.changedStudents, same.changedPossible]).toEqual([[], [], [], [], [], []]);
    expect(same.merged.gradebook).toEqual(OLD);
  });

  it('previewMerge reads the newer file from disk and records it as the source', async () => {
    const dir = tempDir();
    const first = writeTemp(dir, 'week1.xlsx', workbookBytes([{ name: 'S', rows: [['ID', 'Name', 'Q1 (10)'], ['1', 'Ann', 8], ['2', 'Bo', 6]] }]));
    const second = writeTemp(dir, 'week2.xlsx', workbookBytes([{ name: 'S', rows: [['ID', 'Name', 'Q1 (10)', 'Q2 (10)'], ['1', 'Ann', 8, 9], ['3', 'Cy', 5, 5]] }]));
    const start = await detectAndImport(first);
    if (!start.ok) throw new Error(start.message);
    const project: CourseProject = { title: 'T', gradebook: start.value.gradebook, plan: PLAN, source: null, notes: '' };
    const next = await detectAndImport(second);
    if (!next.ok) throw new Error(next.message);
    const r = await previewMerge(project, second, next.value.layout);
    if (!r.ok) throw new Error(r.message);
    expect(r.value.addedStudents.map((s) => s.id)).toEqual(['3']);
    expect(r.value.missingStudents.map((s) => s.id)).toEqual(['2']);
    expect(r.value.addedAssessments).toEqual(['Q2 (10)']);
    expect(r.value.merged.source?.fileName).toBe('week2.xlsx');
    expect(r.value.merged.source?.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(r.value.merged.gradebook.scores[1]).toEqual([{ kind: 'earned', points: 6 }, { kind: 'pending' }]);
  });

  it('previewMerge refuses a bad file and changes nothing', async () => {
    const dir = tempDir();
    const bad = writeTemp(dir, 'bad.xlsx', workbookBytes([{ name: 'S', rows: [['ID', 'Name', 'Q1 (10)'], ['1', 'Ann', 'abc']] }]));
    const layout = { sheets: [{ sheet: 'S', headerRow: 0, possibleRow: null, columns: [{ index: 0, header: 'ID', role: 'id' as const }, { index: 2, header: 'Q1 (10)', role: 'assessment' as const, possible: 10 }] }], sectionFrom: 'column' as const, tokens: DEFAULT_TOKENS };
    const before = JSON.stringify(PROJECT);
    const r = await previewMerge(PROJECT, bad, layout);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.problems?.map((p) => [p.code, p.at?.row, p.at?.column])).toEqual([['unreadable-score', 2, 'C']]);
    expect(JSON.stringify(PROJECT)).toBe(before);
  });
});

/**
 * Seeded synthetic courses for the benchmark — invented numbers, no real course, not the demo.
 *
 * Shape (per 60 assessments; other counts scale the groups): homework (total points, unequal
 * possible, drop 2, missing = 0), quizzes (equal items, drop 1), labs (equal items, missing left out,
 * cap 100), two midterms, a project and a final exam, plus one extra-credit item. About 3 % of cells
 * are missing, 1 % excused and the last few items pending for some sections; a handful of students
 * and one section have a waiver; one section gets +2 points and the course is scaled to a mean of 75.
 */
import type { Assessment, Category, Gradebook, GradingPlan, ItemRule, Score, Student } from '../renderer/engine/model';
import { DEFAULT_SCALE } from '../renderer/engine/grading/gradeScale';
import { mulberry32 } from '../demo-data/generate';

/** The demo generator's seeded PRNG (Mulberry32), shared so there is one copy. */
export const seeded = mulberry32;

export interface CourseSize {
  readonly students: number;
  readonly assessments: number;
  readonly sections: number;
  readonly seed: number;
}

interface Group {
  readonly category: Category;
  readonly count: number;
  readonly possible: (i: number) => number;
}

function groups(assessments: number): Group[] {
  const cat = (id: string, name: string, weight: number, extra: Partial<Category>): Category => ({
    id,
    name,
    weight,
    combine: 'totalPoints',
    dropLowest: 0,
    missingAs: 'zero',
    capPercent: null,
    droppedForCourse: false,
    ...extra,
  });
  // Fixed items: 2 midterms, project, final, 1 bonus = 5; the rest split 1/3 : 1/3 : 1/3.
  const rest = Math.max(3, assessments - 5);
  const hw = Math.ceil(rest / 3);
  const quiz = Math.ceil((rest - hw) / 2);
  const labs = rest - hw - quiz;
  return [
    { category: cat('hw', 'Homework', 20, { dropLowest: 2 }), count: hw, possible: (i) => [10, 15, 20, 25][i % 4]! },
    { category: cat('quiz', 'Quizzes', 15, { combine: 'equalItems', dropLowest: 1 }), count: quiz, possible: () => 10 },
    { category: cat('lab', 'Labs', 15, { combine: 'equalItems', missingAs: 'excluded', capPercent: 100 }), count: labs, possible: () => 5 },
    { category: cat('mid', 'Midterms', 25, {}), count: 2, possible: () => 50 },
    { category: cat('proj', 'Project', 10, { capPercent: 100 }), count: 1, possible: () => 40 },
    { category: cat('final', 'Final exam', 15, {}), count: 1, possible: () => 100 },
  ];
}

export function sectionName(k: number): string {
  return `S${String(k + 1).padStart(2, '0')}`;
}

/** The gradebook and plan of a synthetic course; identical for identical sizes and seed. */
export function syntheticCourse(size: CourseSize): { book: Gradebook; plan: GradingPlan } {
  const rand = seeded(size.seed);
  const gs = groups(size.assessments);
  const assessments: Assessment[] = [];
  const items: Record<string, ItemRule> = {};
  for (const g of gs) {
    for (let i = 0; i < g.count; i++) {
      const id = `${g.category.name} ${i + 1}`;
      assessments.push({ id, name: id, possible: g.possible(i) });
      items[id] = { categoryId: g.category.id, extraCredit: false };
    }
  }
  assessments.push({ id: 'Bonus', name: 'Bonus', possible: 5 });
  items['Bonus'] = { categoryId: 'proj', extraCredit: true };
  const A = assessments.length;
  const students: Student[] = [];
  const scores: Score[][] = [];
  for (let s = 0; s < size.students; s++) {
    const section = sectionName(s % size.sections);
    students.push({ id: `B${String(1_000_000 + s)}`, name: `Student ${s + 1}`, section });
    const ability = 0.55 + 0.4 * rand();
    const row: Score[] = [];
    for (let a = 0; a < A; a++) {
      const u = rand();
      const possible = assessments[a]!.possible;
      const pendingTail = s % size.sections < size.sections / 4 && a >= A - 3 && a < A - 1;
      if (pendingTail) row.push({ kind: 'pending' });
      else if (u < 0.03) row.push({ kind: 'missing' });
      else if (u < 0.04) row.push({ kind: 'excused' });
      else {
        const raw = possible * Math.min(1.05, Math.max(0, ability + 0.25 * (rand() - 0.5)));
        // Whole and half points, as markers write them.
        row.push({ kind: 'earned', points: Math.min(possible, Math.round(raw * 2) / 2) });
      }
    }
    scores.push(row);
  }
  const plan: GradingPlan = {
    categories: gs.map((g) => g.category),
    items,
    sectionWaivers: size.sections > 1 ? [{ section: sectionName(1), categoryId: 'lab', note: 'no lab room' }] : [],
    studentWaivers: students.filter((_, i) => i % 997 === 5).map((st) => ({ studentId: st.id, categoryId: 'mid', note: 'accommodation' })),
    markMode: 'current',
    scale: DEFAULT_SCALE,
    rounding: { decimals: 1 },
    adjustments: [
      { kind: 'addPoints', section: sectionName(0), points: 2 },
      { kind: 'scaleToMean', section: null, targetMean: 75 },
      { kind: 'cap', section: null, maxPercent: 100 },
    ],
  };
  return { book: { students, assessments, scores }, plan };
}

function cellText(score: Score): string {
  switch (score.kind) {
    case 'earned':
      return String(score.points);
    case 'missing':
      return '';
    case 'excused':
      return 'EX';
    case 'pending':
      return 'pending';
  }
}

/** The gradebook as a grid: header row, points-possible row, one row per student. */
export function gradebookRows(book: Gradebook): string[][] {
  const header = ['Student ID', 'Name', 'Section', ...book.assessments.map((a) => a.name)];
  const possible = ['Points possible', '', '', ...book.assessments.map((a) => String(a.possible))];
  const rows = book.students.map((st, s) => [st.id, st.name, st.section, ...(book.scores[s] ?? []).map(cellText)]);
  return [header, possible, ...rows];
}

/** RFC 4180 CSV (no cell here needs quoting: ids, names, numbers and tokens only). */
export function toCsv(rows: readonly (readonly string[])[]): string {
  return rows.map((r) => r.join(',')).join('\r\n') + '\r\n';
}

/**
 * The store's grading (renderer/state/courseGrading.ts) must give exactly what the plain engine
 * gives — gradeCourse (renderer/engine/grading, itself checked against published sources in
 * tests/engine/grading/) — after every step of a random edit sequence: weight edits (reweigh),
 * score edits through the history's own applyEdit (updateScore), other plan edits, gradebook
 * replacements and returns to an earlier state (undo/redo). Compared with === (Object.is): finals,
 * letters, grade points, weighted and adjusted percents, effective weights, plan problems, and the
 * explanation lines, which the store computes lazily per student — read here both at once and
 * after later edits have changed the fast grades in place.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { CourseProject } from '../../renderer/bridge/contract';
import { gradeCourse, type CourseResult } from '../../renderer/engine/grading/gradeCourse';
import type { Adjustment, Gradebook, GradingPlan, Score } from '../../renderer/engine/model';
import { CourseGrading, singleChangedCell, type GradingStep } from '../../renderer/state/courseGrading';
import { applyEdit } from '../../renderer/state/history';
import { courseArb, scoreFor } from '../engine/fast/arbitraries';

type Step =
  | { kind: 'weight'; category: number; weight: number }
  | { kind: 'score'; student: number; assessment: number; score: Score }
  | { kind: 'markMode' }
  | { kind: 'drop'; category: number; drop: number }
  | { kind: 'decimals'; decimals: number }
  | { kind: 'adjustment'; adjustment: Adjustment }
  | { kind: 'moveItem'; assessment: number; category: number }
  | { kind: 'copyGradebook' }
  | { kind: 'back'; to: number };

const adjustmentArb: fc.Arbitrary<Adjustment> = fc.oneof(
  fc.record({ kind: fc.constant('addPoints' as const), section: fc.constantFrom(null, 'A', 'B'), points: fc.double({ min: -5, max: 5, noNaN: true }) }),
  fc.record({ kind: fc.constant('scaleToMean' as const), section: fc.constantFrom(null, 'A', 'A10'), targetMean: fc.constantFrom(70, 80, 91.5) }),
  fc.record({ kind: fc.constant('cap' as const), section: fc.constantFrom(null, 'B'), maxPercent: fc.constantFrom(100, 92.5) }),
);

function stepArb(book: Gradebook): fc.Arbitrary<Step> {
  const score = fc
    .tuple(fc.nat(book.students.length - 1), fc.nat(book.assessments.length - 1))
    .chain(([student, assessment]) => scoreFor(book.assessments[assessment]!.possible).map((s): Step => ({ kind: 'score', student, assessment, score: s })));
  return fc.oneof(
    { weight: 4, arbitrary: fc.record({ kind: fc.constant('weight' as const), category: fc.nat(), weight: fc.oneof(fc.constantFrom(0, 15, 40, 33.33), fc.double({ min: 0, max: 100, noNaN: true })) }) },
    { weight: 4, arbitrary: score },
    { weight: 1, arbitrary: fc.constant<Step>({ kind: 'markMode' }) },
    { weight: 1, arbitrary: fc.record({ kind: fc.constant('drop' as const), category: fc.nat(), drop: fc.integer({ min: 0, max: 2 }) }) },
    { weight: 1, arbitrary: fc.record({ kind: fc.constant('decimals' as const), decimals: fc.constantFrom(0, 1, 2) }) },
    { weight: 1, arbitrary: fc.record({ kind: fc.constant('adjustment' as const), adjustment: adjustmentArb }) },
    { weight: 1, arbitrary: fc.record({ kind: fc.constant('moveItem' as const), assessment: fc.nat(), category: fc.nat() }) },
    { weight: 1, arbitrary: fc.constant<Step>({ kind: 'copyGradebook' }) },
    { weight: 2, arbitrary: fc.record({ kind: fc.constant('back' as const), to: fc.nat() }) },
  );
}

function withCategory(plan: GradingPlan, index: number, change: (c: GradingPlan['categories'][number]) => GradingPlan['categories'][number]): GradingPlan {
  const c = index % plan.categories.length;
  return { ...plan, categories: plan.categories.map((cat, i) => (i === c ? change(cat) : cat)) };
}

/** The project after one step; `history` holds every earlier project (for 'back'). */
function after(project: CourseProject, step: Step, history: readonly CourseProject[]): CourseProject {
  const { plan, gradebook } = project;
  const planned = (p: GradingPlan): CourseProject => applyEdit(project, { kind: 'updatePlan', label: step.kind, plan: p });
  switch (step.kind) {
    case 'weight':
      return planned(withCategory(plan, step.category, (c) => ({ ...c, weight: step.weight })));
    case 'score':
      return applyEdit(project, { kind: 'setScore', studentIndex: step.student, assessmentIndex: step.assessment, score: step.score });
    case 'markMode':
      return planned({ ...plan, markMode: plan.markMode === 'current' ? 'projected' : 'current' });
    case 'drop':
      return planned(withCategory(plan, step.category, (c) => ({ ...c, dropLowest: step.drop })));
    case 'decimals':
      return planned({ ...plan, rounding: { decimals: step.decimals } });
    case 'adjustment':
      return planned({ ...plan, adjustments: [...plan.adjustments, step.adjustment] });
    case 'moveItem': {
      const a = gradebook.assessments[step.assessment % gradebook.assessments.length]!;
      const categoryId = plan.categories[step.category % plan.categories.length]!.id;
      return planned({ ...plan, items: { ...plan.items, [a.id]: { categoryId, extraCredit: plan.items[a.id]?.extraCredit ?? false } } });
    }
    case 'copyGradebook':
      return applyEdit(project, { kind: 'updateGradebook', label: 'copy', gradebook: structuredClone(gradebook) });
    case 'back':
      return history[step.to % history.length]!;
  }
}

/** Every field of the store's result against the plain engine's, with Object.is on numbers. */
function expectEqual(mine: CourseResult, plain: CourseResult, where: string): void {
  expect(mine.planProblems, where).toStrictEqual(plain.planProblems);
  expect(mine.students.length, where).toBe(plain.students.length);
  plain.students.forEach((p, s) => {
    const r = mine.students[s]!;
    const at = `${where}, student ${s}`;
    expect(r.studentId, at).toBe(p.studentId);
    expect(r.section, at).toBe(p.section);
    expect(r.weighted, at).toBe(p.weighted);
    expect(r.adjusted, at).toBe(p.adjusted);
    expect(r.final, at).toBe(p.final);
    expect(r.letter, at).toBe(p.letter);
    expect(r.gradePoints, at).toBe(p.gradePoints);
    expect({ ...r.effectiveWeights }, at).toStrictEqual(p.effectiveWeights);
    expect(r.lines, at).toStrictEqual(p.lines);
  });
}

/** Real gradebooks have one cell per assessment in every row (the project schema checks it). */
function fullRows(book: Gradebook): Gradebook {
  return { ...book, scores: book.scores.map((row) => Array.from({ length: book.assessments.length }, (_, a): Score => row[a] ?? { kind: 'missing' })) };
}

describe('the store’s grading equals gradeCourse', () => {
  it('after every step of random edit sequences (weights, scores, other plan edits, undo/redo)', () => {
    const seen = new Set<GradingStep>();
    fc.assert(
      fc.property(
        courseArb.chain((c) => {
          const book = fullRows(c.book);
          return fc.tuple(fc.constant({ book, plan: c.plan }), fc.array(stepArb(book), { minLength: 1, maxLength: 8 }));
        }),
        ([{ book, plan }, steps]) => {
          const grading = new CourseGrading();
          let project: CourseProject = { title: 't', gradebook: book, plan, source: null, notes: '' };
          const history: CourseProject[] = [project];
          const kept: { result: CourseResult; project: CourseProject }[] = [];
          expectEqual(grading.grade(book, plan), gradeCourse(book, plan), 'start');
          steps.forEach((step, i) => {
            project = after(project, step, history);
            history.push(project);
            const result = grading.grade(project.gradebook, project.plan);
            seen.add(grading.lastStep);
            // Read nothing yet from every other result: its lines are checked after later edits.
            if (i % 2 === 0) expectEqual(result, gradeCourse(project.gradebook, project.plan), `step ${i} (${step.kind})`);
            else kept.push({ result, project });
          });
          for (const { result, project: p } of kept) expectEqual(result, gradeCourse(p.gradebook, p.plan), 'read after later edits');
        },
      ),
      { numRuns: 300 },
    );
    // Every way of bringing the grades up to date was exercised.
    expect([...seen].sort()).toEqual(['full', 'reweigh', 'unchanged', 'updateScore']);
  });

  it('gives the same object again for the same gradebook and plan', () => {
    fc.assert(
      fc.property(courseArb, ({ book, plan }) => {
        const full = fullRows(book);
        const grading = new CourseGrading();
        const first = grading.grade(full, plan);
        expect(grading.grade(full, plan)).toBe(first);
        expect(grading.lastStep).toBe('unchanged');
      }),
      { numRuns: 20 },
    );
  });
});

describe('singleChangedCell', () => {
  const book: Gradebook = {
    students: [{ id: 's1', name: 'One', section: 'A' }, { id: 's2', name: 'Two', section: 'A' }],
    assessments: [{ id: 'a', name: 'A', possible: 10 }, { id: 'b', name: 'B', possible: 10 }],
    scores: [
      [{ kind: 'earned', points: 1 }, { kind: 'missing' }],
      [{ kind: 'excused' }, { kind: 'earned', points: 2 }],
    ],
  };
  const project: CourseProject = { title: 't', gradebook: book, plan: { categories: [], items: {}, sectionWaivers: [], studentWaivers: [], markMode: 'current', scale: { name: 's', cutoffs: [] }, rounding: { decimals: 0 }, adjustments: [] }, source: null, notes: '' };

  it('finds the cell a score edit changed, and only that one', () => {
    const edited = applyEdit(project, { kind: 'setScore', studentIndex: 1, assessmentIndex: 0, score: { kind: 'earned', points: 7 } }).gradebook;
    expect(singleChangedCell(book, edited)).toEqual({ student: 1, assessment: 0 });
    const twice = applyEdit({ ...project, gradebook: edited }, { kind: 'setScore', studentIndex: 0, assessmentIndex: 1, score: { kind: 'pending' } }).gradebook;
    expect(singleChangedCell(book, twice)).toBeNull();
    expect(singleChangedCell(book, { ...book, students: [...book.students] })).toBeNull();
    expect(singleChangedCell(book, book)).toBeNull();
  });
});

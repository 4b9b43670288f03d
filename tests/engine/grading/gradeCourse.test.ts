import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { gradeCourse } from '../../../renderer/engine/grading/gradeCourse';
import { checkPlan } from '../../../renderer/engine/grading/checkPlan';
import type { Gradebook, GradingPlan, Score } from '../../../renderer/engine/model';
import type { CategoryLine, StudentResult } from '../../../renderer/engine/results';
import { book, category, E, EXC, MISS, PEND, plan, type Column } from './helpers';

// Expected values: hand arithmetic from the definitions (gradeCourse.ts pipeline); weighted mean and
// re-normalisation are common practice, no source; Kane & Kane (2006) for the drop choice.

const cols: Column[] = [
  { id: 'q1', possible: 10, categoryId: 'quizzes' },
  { id: 'q2', possible: 10, categoryId: 'quizzes' },
  { id: 'q3', possible: 10, categoryId: 'quizzes' },
  { id: 'mid', possible: 50, categoryId: 'exams' },
  { id: 'fin', possible: 100, categoryId: 'exams' },
  { id: 'lab', possible: 20, categoryId: 'labs' },
];
const cats = [
  category('quizzes', 20, { dropLowest: 1 }),
  category('exams', 50),
  category('labs', 30),
];

const categoryLines = (r: StudentResult): CategoryLine[] => r.lines.filter((l): l is CategoryLine => l.kind === 'category');
const kinds = (r: StudentResult): string[] => r.lines.map((l) => l.kind);

describe('gradeCourse: the pipeline by hand', () => {
  const b = book(cols, [
    { student: { id: 's1' }, scores: [E(4), E(8), E(9), E(40), E(85), E(18)] },
    { student: { id: 's2', section: 'B' }, scores: [E(10), EXC, MISS, E(25), PEND, PEND] },
  ]);

  it('student 1: quizzes drop the 4 → 17/20 = 85; exams 125/150; labs 90; weighted 20·85+50·83.33+30·90 over 100', () => {
    const r = gradeCourse(b, plan(cols, cats)).students[0]!;
    const exams = (100 * 125) / 150;
    const weighted = (20 * 85 + 50 * exams + 30 * 90) / 100; // = 85.6666…
    expect(r.weighted).toBeCloseTo(weighted, 12);
    expect(r.final).toBe(85.67);
    expect(r.letter).toBe('B');
    expect(r.gradePoints).toBe(3.0);
    expect(r.effectiveWeights).toEqual({ quizzes: 20, exams: 50, labs: 30 });
    expect(kinds(r)).toEqual([
      'item', 'item', 'item', 'category',
      'item', 'item', 'category',
      'item', 'category',
      'weighted', 'rounding', 'cutoff',
    ]);
    expect(r.lines[0]).toMatchObject({ kind: 'item', assessmentId: 'q1', status: 'dropped' });
    expect(categoryLines(r)[0]).toMatchObject({ percent: 85, dropped: 1, effectiveWeight: 20, contribution: 17 });
  });

  it('student 2, current mark: labs nothing graded → its 30 re-normalised away; quizzes 10/20, exams 25/50', () => {
    const r = gradeCourse(b, plan(cols, cats)).students[1]!;
    // quizzes: q1 10/10, q2 excused, q3 missing = 0 → drop 1 drops the 0 → 10/10 = 100 %
    // exams: fin pending (left out) → 25/50 = 50 %; labs: pending only → nothing graded
    // weights 20 and 50 → 2/7 and 5/7: (20·100 + 50·50)/70 = 64.2857…
    expect(r.weighted).toBeCloseTo(4500 / 70, 12);
    expect(r.final).toBe(64.29);
    expect(r.letter).toBe('D');
    expect(r.effectiveWeights.labs).toBe(0);
    expect(r.effectiveWeights.quizzes).toBeCloseTo(200 / 7, 12);
    expect(categoryLines(r)[2]).toMatchObject({ categoryId: 'labs', status: 'nothingGraded', percent: null, effectiveWeight: 0, contribution: null });
  });

  it('student 2, projected final: pending counts as 0, labs count as 0', () => {
    const r = gradeCourse(b, plan(cols, cats, { markMode: 'projected' })).students[1]!;
    // quizzes 100 (as above); exams (25 + 0)/150 = 16.67; labs 0/20 = 0
    // (20·100 + 50·16.666… + 30·0)/100 = 28.333…
    expect(r.weighted).toBeCloseTo((2000 + (50 * 2500) / 150) / 100, 12);
    expect(r.final).toBe(28.33);
    expect(r.effectiveWeights).toEqual({ quizzes: 20, exams: 50, labs: 30 });
  });

  it('contributions sum to the weighted percent and effective weights to 100 (explanation consistency)', () => {
    for (const mode of ['current', 'projected'] as const) {
      for (const r of gradeCourse(b, plan(cols, cats, { markMode: mode })).students) {
        const lines = categoryLines(r);
        const contrib = lines.reduce((s, l) => s + (l.contribution ?? 0), 0);
        expect(contrib).toBeCloseTo(r.weighted!, 10);
        expect(lines.reduce((s, l) => s + l.effectiveWeight, 0)).toBeCloseTo(100, 10);
        const w = r.lines.find((l) => l.kind === 'weighted');
        expect(w).toEqual({ kind: 'weighted', percent: r.weighted });
        const rounding = r.lines.find((l) => l.kind === 'rounding');
        expect(rounding).toMatchObject({ before: r.adjusted, after: r.final });
      }
    }
  });
});

describe('gradeCourse: waivers, course drop, no mark', () => {
  const b = book(cols, [
    { student: { id: 's1', section: 'A' }, scores: [E(10), E(10), E(10), E(25), E(50), E(10)] },
    { student: { id: 's2', section: 'B' }, scores: [E(10), E(10), E(10), E(25), E(50), E(10)] },
  ]);
  // quizzes 100, exams 75/150 = 50, labs 50

  it('section waiver re-normalises only that section', () => {
    const p = plan(cols, cats, { sectionWaivers: [{ section: 'B', categoryId: 'labs' }] });
    const [a, bb] = gradeCourse(b, p).students;
    expect(a!.weighted).toBeCloseTo((20 * 100 + 50 * 50 + 30 * 50) / 100, 12); // 60
    expect(bb!.weighted).toBeCloseTo((20 * 100 + 50 * 50) / 70, 12); // 64.2857
    expect(categoryLines(bb!)[2]!.status).toBe('waivedForSection');
    // a waived category's items are not listed as counted
    expect(bb!.lines.some((l) => l.kind === 'item' && l.categoryId === 'labs')).toBe(false);
  });

  it('student waiver and course drop', () => {
    const p = plan(cols, [cats[0]!, category('exams', 50, { droppedForCourse: true }), cats[2]!], {
      studentWaivers: [{ studentId: 's1', categoryId: 'labs' }],
    });
    const [a, bb] = gradeCourse(b, p).students;
    expect(a!.weighted).toBeCloseTo(100, 12); // quizzes only
    expect(a!.effectiveWeights).toEqual({ quizzes: 100, exams: 0, labs: 0 });
    expect(categoryLines(a!).map((l) => l.status)).toEqual(['counted', 'droppedForCourse', 'waivedForStudent']);
    expect(bb!.weighted).toBeCloseTo((20 * 100 + 30 * 50) / 50, 12); // 70
  });

  it('no counting category → final null with a reason naming each category', () => {
    const p = plan(cols, cats, { studentWaivers: ['quizzes', 'exams', 'labs'].map((categoryId) => ({ studentId: 's1', categoryId })) });
    const r = gradeCourse(b, p).students[0]!;
    expect(r).toMatchObject({ weighted: null, adjusted: null, final: null, letter: null, gradePoints: null });
    const last = r.lines.at(-1)!;
    expect(last.kind).toBe('noMark');
    expect(last.kind === 'noMark' && last.reason).toBe(
      'No category counts for this student (Quizzes: waived for the student; Exams: waived for the student; Labs: waived for the student).',
    );
  });

  it('nothing graded yet anywhere (current) → no mark; projected → 0 and F', () => {
    const empty = book(cols, [{ student: { id: 's1' }, scores: cols.map((): Score => PEND) }]);
    expect(gradeCourse(empty, plan(cols, cats)).students[0]!.final).toBeNull();
    const projected = gradeCourse(empty, plan(cols, cats, { markMode: 'projected' })).students[0]!;
    expect(projected.final).toBe(0);
    expect(projected.letter).toBe('F');
  });

  it('a category with no assessments: left out of the current mark, 0 in the projected final', () => {
    const p = plan(cols, [...cats, category('project', 100)]);
    expect(gradeCourse(b, p).students[0]!.weighted).toBeCloseTo(60, 12);
    expect(gradeCourse(b, { ...p, markMode: 'projected' }).students[0]!.weighted).toBeCloseTo(30, 12);
  });

  it('a final below every cutoff gets no letter and says so', () => {
    const p = plan(cols, cats, { scale: { name: 'Honours', cutoffs: [{ letter: 'H', minPercent: 80 }] } });
    const r = gradeCourse(b, p).students[0]!;
    expect(r.final).toBe(60);
    expect(r.letter).toBeNull();
    expect(r.lines.at(-1)).toEqual({ kind: 'noMark', reason: 'The final 60 % is below every cutoff of the scale "Honours", so there is no letter.' });
  });
});

describe('gradeCourse: rounding once, at the end', () => {
  it('3·21.6 + 97·91.6 over 100 is 89.49999999999999 in floats and still rounds to 90 → A-', () => {
    const c2: Column[] = [
      { id: 'x', possible: 100, categoryId: 'small' },
      { id: 'y', possible: 100, categoryId: 'big' },
    ];
    const b = book(c2, [{ student: { id: 's' }, scores: [E(21.6), E(91.6)] }]);
    const r = gradeCourse(b, plan(c2, [category('small', 3), category('big', 97)], { rounding: { decimals: 0 } })).students[0]!;
    expect(r.weighted!).toBeLessThan(89.5); // the float artefact is really there
    expect(r.final).toBe(90);
    expect(r.letter).toBe('A-');
    // one decimal: 89.5 exactly
    const r1 = gradeCourse(b, plan(c2, [category('small', 3), category('big', 97)], { rounding: { decimals: 1 } })).students[0]!;
    expect(r1.final).toBe(89.5);
    expect(r1.letter).toBe('B+');
  });
});

describe('gradeCourse: invariance (property)', () => {
  const scoreArb = (possible: number): fc.Arbitrary<Score> =>
    fc.oneof(
      { weight: 6, arbitrary: fc.integer({ min: 0, max: possible * 4 }).map((q) => E(q / 4)) },
      { weight: 1, arbitrary: fc.constantFrom<Score>(MISS, EXC, PEND) },
    );
  const bookArb = fc.integer({ min: 1, max: 6 }).chain((n) =>
    fc.array(fc.tuple(...cols.map((c) => scoreArb(c.possible))), { minLength: n, maxLength: n }).map((rows) =>
      book(
        cols,
        rows.map((scores, i) => ({ student: { id: `s${i}`, section: i % 2 === 0 ? 'A' : 'B' }, scores })),
      ),
    ),
  );
  const planArb = fc.record({
    markMode: fc.constantFrom('current' as const, 'projected' as const),
    drop: fc.integer({ min: 0, max: 2 }),
    combine: fc.constantFrom('totalPoints' as const, 'equalItems' as const),
    add: fc.integer({ min: -5, max: 5 }),
  }).map(({ markMode, drop, combine, add }): GradingPlan =>
    plan(cols, [category('quizzes', 20, { dropLowest: drop, combine }), cats[1]!, cats[2]!], {
      markMode,
      adjustments: [
        { kind: 'addPoints', section: 'A', points: add },
        { kind: 'scaleToMean', section: null, targetMean: 70 },
        { kind: 'cap', section: null, maxPercent: 100 },
      ],
    }),
  );

  const shuffle = <T,>(xs: readonly T[], keys: readonly number[]): number[] =>
    xs.map((_, i) => i).sort((a, b) => (keys[a] ?? 0) - (keys[b] ?? 0) || a - b);

  it('the same marks whatever the order of students and of assessments', () => {
    fc.assert(
      fc.property(bookArb, planArb, fc.array(fc.double({ noNaN: true }), { minLength: 12, maxLength: 12 }), (b, p, keys) => {
        const base = gradeCourse(b, p).students;
        const sOrder = shuffle(b.students, keys);
        const aOrder = shuffle(b.assessments, keys.slice(6));
        const permuted: Gradebook = {
          students: sOrder.map((i) => b.students[i]!),
          assessments: aOrder.map((j) => b.assessments[j]!),
          scores: sOrder.map((i) => aOrder.map((j) => b.scores[i]![j]!)),
        };
        const again = gradeCourse(permuted, p).students;
        sOrder.forEach((i, k) => {
          const x = base[i]!;
          const y = again[k]!;
          expect(y.studentId).toBe(x.studentId);
          if (x.weighted === null) expect(y.weighted).toBeNull();
          else expect(y.weighted!).toBeCloseTo(x.weighted, 9);
          expect(y.final).toBe(x.final);
          expect(y.letter).toBe(x.letter);
        });
      }),
      { numRuns: 150 },
    );
  });

  it('without adjustments the weighted percent lies between the lowest and highest counted category', () => {
    fc.assert(
      fc.property(bookArb, planArb, (b, p) => {
        for (const r of gradeCourse(b, { ...p, adjustments: [] }).students) {
          if (r.weighted === null) continue;
          const counted = categoryLines(r).filter((l) => l.status === 'counted').map((l) => l.percent!);
          expect(r.weighted).toBeGreaterThanOrEqual(Math.min(...counted) - 1e-9);
          expect(r.weighted).toBeLessThanOrEqual(Math.max(...counted) + 1e-9);
        }
      }),
      { numRuns: 150 },
    );
  });
});

describe('gradeCourse: plan problems', () => {
  it('lists weight sum, unknown category, negative weight, ungraded assessment, empty category, bad rounding', () => {
    const c2: Column[] = [
      { id: 'a', possible: 10, categoryId: 'quizzes' },
      { id: 'b', possible: 10, categoryId: 'nope' },
      { id: 'c', possible: 10, categoryId: null },
    ];
    const b = book(c2, [{ student: { id: 's' }, scores: [E(5), E(5), E(5)] }]);
    const p = plan(c2, [category('quizzes', 50), category('labs', -10)], { rounding: { decimals: 1.5 } });
    const problems = gradeCourse(b, p).planProblems;
    const has = (text: string): boolean => problems.some((m) => m.includes(text));
    expect(has('sum to 50, not 100')).toBe(true);
    expect(has('names category "nope", which does not exist')).toBe(true);
    expect(has('Category "Labs" has weight -10')).toBe(true);
    expect(has('Assessment "c" is in no category')).toBe(true);
    expect(has('Category "Labs" has no assessments')).toBe(true);
    expect(has('Rounding to 1.5 decimals')).toBe(true);
    // and the marks are still computed: quizzes only, rounded to 0 decimals
    expect(gradeCourse(b, p).students[0]!.final).toBe(50);
  });

  it('a clean plan has no problems (weights 33.33 + 33.33 + 33.34 count as 100)', () => {
    const c2: Column[] = [
      { id: 'a', possible: 10, categoryId: 'x' },
      { id: 'b', possible: 10, categoryId: 'y' },
      { id: 'c', possible: 10, categoryId: 'z' },
    ];
    const b = book(c2, [{ student: { id: 's' }, scores: [E(5), E(5), E(5)] }]);
    expect(gradeCourse(b, plan(c2, [category('x', 33.33), category('y', 33.33), category('z', 33.34)])).planProblems).toEqual([]);
  });
});


describe('checkPlan: the rest of the checks', () => {
  it('duplicate ids, unknown waivers and sections, bad targets, ragged rows, rules for absent assessments, bad points', () => {
    const c2: Column[] = [
      { id: 'a', possible: 10, categoryId: 'x' },
      { id: 'z', possible: 0, categoryId: 'x' },
    ];
    const b: Gradebook = {
      ...book(c2, [{ student: { id: 's' }, scores: [E(Number.NaN)] }]),
    };
    const p: GradingPlan = {
      ...plan(c2, [category('x', 50), category('x', 50)], {
        sectionWaivers: [{ section: 'Q', categoryId: 'nope' }],
        studentWaivers: [{ studentId: 'ghost', categoryId: 'x' }],
        adjustments: [{ kind: 'scaleToMean', section: 'Q', targetMean: 0 }],
      }),
      items: { a: { categoryId: 'x', extraCredit: false }, z: { categoryId: 'x', extraCredit: false }, old: { categoryId: 'x', extraCredit: false } },
    };
    const problems = checkPlan(b, p);
    const expected = [
      'Category id "x" is used twice',
      'Assessment "z" has 0 points possible',
      'rule for assessment "old", which is not in the gradebook',
      'A waiver for section "Q" names unknown category "nope"',
      'A waiver names section "Q", which has no students',
      'A waiver names student "ghost", who is not on the roster',
      'Adjustment 1 names section "Q"',
      'Adjustment 1 scales to a mean of 0',
      'Student s has NaN points on "a"',
      'Gradebook row 1 has 1 scores for 2 assessments',
    ];
    for (const text of expected) expect(problems.some((m) => m.includes(text)), text).toBe(true);
    // marks still computed: NaN points count as 0, the 0-possible column is left out
    const r = gradeCourse(b, p).students[0]!;
    expect(r.final).toBe(0);
    // (the duplicated category is graded twice — each copy lists item a; z never appears)
    expect(new Set(r.lines.filter((l) => l.kind === 'item').map((l) => l.kind === 'item' && l.assessmentId))).toEqual(new Set(['a']));
  });
});

describe('checkPlan on one gradebook under several plans', () => {
  it('gives for each plan what a fresh copy of the gradebook gives (the gradebook checks are kept per gradebook)', () => {
    const cols: Column[] = [{ id: 'a', possible: 10, categoryId: 'x' }];
    const b = book(cols, [{ student: { id: 's', section: 'A' }, scores: [E(Number.NaN)] }, { student: { id: 't', section: 'B' }, scores: [E(4)] }]);
    const plans: GradingPlan[] = [
      plan(cols, [category('x', 100)]),
      plan(cols, [category('x', 60)], { sectionWaivers: [{ section: 'C', categoryId: 'x' }], studentWaivers: [{ studentId: 't', categoryId: 'x' }] }),
      plan(cols, [category('x', 100)], { adjustments: [{ kind: 'addPoints', section: 'A', points: 1 }] }),
    ];
    for (const p of plans) expect(checkPlan(b, p)).toStrictEqual(checkPlan(structuredClone(b), p));
    // A new gradebook (an edit) is checked afresh: the NaN cell fixed, its problem gone.
    const fixed: Gradebook = { ...b, scores: [[E(3)], b.scores[1]!] };
    expect(checkPlan(b, plans[0]!).some((m) => m.includes('NaN points'))).toBe(true);
    expect(checkPlan(fixed, plans[0]!).some((m) => m.includes('NaN points'))).toBe(false);
  });
});

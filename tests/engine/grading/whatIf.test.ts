import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { gradeCourse } from '../../../renderer/engine/grading/gradeCourse';
import { boundaryList, neededOnPending } from '../../../renderer/engine/grading/whatIf';
import { DEFAULT_SCALE } from '../../../renderer/engine/grading/gradeScale';
import type { Gradebook, GradingPlan, Score } from '../../../renderer/engine/model';
import type { StudentResult } from '../../../renderer/engine/results';
import { book, category, E, EXC, MISS, PEND, plan, type Column } from './helpers';

/** The book with every pending cell of one student replaced by t % of its points possible. */
function fill(b: Gradebook, s: number, t: number): Gradebook {
  return {
    ...b,
    scores: b.scores.map((row, i) =>
      i !== s ? row : row.map((c, j): Score => (c.kind === 'pending' ? E((t * b.assessments[j]!.possible) / 100) : c)),
    ),
  };
}
const finalWith = (b: Gradebook, p: GradingPlan, s: number, t: number): number | null =>
  gradeCourse(fill(b, s, t), { ...p, markMode: 'projected' }).students[s]!.final;

const cols: Column[] = [
  { id: 'q1', possible: 10, categoryId: 'quizzes' },
  { id: 'q2', possible: 10, categoryId: 'quizzes' },
  { id: 'exam', possible: 100, categoryId: 'exams' },
];
const cats = [category('quizzes', 40), category('exams', 60)];

describe('neededOnPending', () => {
  const b = book(cols, [{ student: { id: 's' }, scores: [E(8), PEND, PEND] }]);

  it('hand arithmetic: final(t) = 0.4·(8 + t/10)/20·100 + 0.6·t = 16 + 0.8t', () => {
    const p = plan(cols, cats, { rounding: { decimals: 0 } });
    const needed = neededOnPending(b, p, 0);
    const byLetter = new Map(needed.map((n) => [n.letter, n]));
    expect(needed.map((n) => n.letter)).toEqual(DEFAULT_SCALE.cutoffs.map((c) => c.letter));
    // A- at 90, whole-percent rounding: 16 + 0.8t ≥ 89.5 ⇔ t ≥ 91.875 → 91.88 on the 0.01 grid
    expect(byLetter.get('A-')).toEqual({ letter: 'A-', minPercent: 90, status: 'reachable', neededPercent: { defined: true, value: 91.88 } });
    // A+ at 97: t ≥ 100.625 → unreachable (100 % gives 96)
    expect(byLetter.get('A+')).toMatchObject({ status: 'unreachable', neededPercent: { defined: false, reason: 'even 100 % on all pending work gives 96 %' } });
    // F at 0: the projected final 16 already reaches it
    expect(byLetter.get('F')).toEqual({ letter: 'F', minPercent: 0, status: 'reached', neededPercent: { defined: true, value: 0 } });
    // D- at 60: t ≥ (59.5 − 16)/0.8 = 54.375 → 54.38
    expect(byLetter.get('D-')!.neededPercent).toEqual({ defined: true, value: 54.38 });
  });

  it('two decimals: A- needs 16 + 0.8t ≥ 89.995 ⇔ t ≥ 92.49375 → 92.5; 92.49 falls short', () => {
    const p = plan(cols, cats, { rounding: { decimals: 2 } });
    const a = neededOnPending(b, p, 0).find((n) => n.letter === 'A-')!;
    expect(a.neededPercent).toEqual({ defined: true, value: 92.5 });
    expect(finalWith(b, p, 0, 92.5)).toBe(90);
    expect(finalWith(b, p, 0, 92.49)).toBe(89.99);
  });

  it('no pending work: reached where the mark is enough, noPendingWork elsewhere', () => {
    const done = book(cols, [{ student: { id: 's' }, scores: [E(8), E(9), E(80)] }]);
    const needed = neededOnPending(done, plan(cols, cats), 0);
    // final = 0.4·85 + 0.6·80 = 82 → B- reached, B (83) not
    expect(needed.find((n) => n.letter === 'B-')!.status).toBe('reached');
    expect(needed.find((n) => n.letter === 'B')).toMatchObject({ status: 'noPendingWork', neededPercent: { defined: false } });
  });

  it('pending work in a waived category does not count as pending', () => {
    const p = plan(cols, cats, { studentWaivers: [{ studentId: 's', categoryId: 'exams' }] });
    const r = neededOnPending(book(cols, [{ student: { id: 's' }, scores: [E(8), E(7), PEND] }]), p, 0);
    expect(r.find((n) => n.letter === 'A')!.status).toBe('noPendingWork');
  });

  it('refuses a student index that does not exist', () => {
    expect(() => neededOnPending(b, plan(cols, cats), 3)).toThrow(RangeError);
  });

  it('property: the needed percent reaches the cutoff, 0.01 less does not (whole course re-graded, with adjustments)', () => {
    const cell: fc.Arbitrary<Score> = fc.oneof(
      { weight: 3, arbitrary: fc.integer({ min: 0, max: 40 }).map((q) => E(q / 4)) },
      { weight: 2, arbitrary: fc.constant(PEND) },
      { weight: 1, arbitrary: fc.constantFrom<Score>(MISS, EXC) },
    );
    const cols4: Column[] = [
      { id: 'a', possible: 10, categoryId: 'quizzes' },
      { id: 'b', possible: 10, categoryId: 'quizzes' },
      { id: 'c', possible: 10, categoryId: 'quizzes' },
      { id: 'd', possible: 10, categoryId: 'exams' },
    ];
    fc.assert(
      fc.property(
        fc.array(fc.tuple(cell, cell, cell, cell), { minLength: 1, maxLength: 4 }),
        fc.integer({ min: 0, max: 2 }),
        fc.boolean(),
        (rows, decimals, curve) => {
          const b4 = book(cols4, rows.map((scores, i) => ({ student: { id: `s${i}`, section: i % 2 ? 'A' : 'B' }, scores })));
          const p = plan(cols4, [category('quizzes', 30, { dropLowest: 1, combine: 'equalItems' }), category('exams', 70)], {
            rounding: { decimals },
            adjustments: curve ? [{ kind: 'scaleToMean', section: 'B', targetMean: 65 }, { kind: 'addPoints', section: null, points: 2 }] : [],
          });
          for (const n of neededOnPending(b4, p, 0)) {
            if (n.status !== 'reachable' || !n.neededPercent.defined) continue;
            const t = n.neededPercent.value;
            expect(finalWith(b4, p, 0, t)!).toBeGreaterThanOrEqual(n.minPercent);
            const less = finalWith(b4, p, 0, Math.round(t * 100 - 1) / 100);
            expect(less === null || less < n.minPercent).toBe(true);
          }
        },
      ),
      { numRuns: 60 },
    );
  });
});

describe('boundaryList', () => {
  const result = (studentId: string, final: number | null, section = 'A'): StudentResult => ({
    studentId, section, weighted: final, adjusted: final, final, letter: null, gradePoints: null, effectiveWeights: {}, lines: [],
  });
  it('students within `within` points below the next cutoff, closest first (default ± scale)', () => {
    const list = boundaryList(
      [result('s1', 89), result('s2', 89.5, 'B'), result('s3', 79.9), result('s4', 96.5, 'A'), result('s5', 100), result('s6', 85), result('s7', null)],
      DEFAULT_SCALE,
      1,
    );
    expect(list.map((e) => [e.studentId, e.nextLetter, e.gap])).toEqual([
      ['s3', 'B-', 0.1], // 80 − 79.9, snapped (the float difference is 0.09999999999999432)
      ['s4', 'A+', 0.5], // ties by section, then id
      ['s2', 'A-', 0.5],
      ['s1', 'A-', 1],
    ]);
    expect(list[0]).toEqual({ studentId: 's3', section: 'A', final: 79.9, letter: null, nextLetter: 'B-', nextMin: 80, gap: 0.1 });
  });
  it('a student exactly at a cutoff is not below it', () => {
    expect(boundaryList([result('s', 90)], DEFAULT_SCALE, 2)).toEqual([]);
  });
});

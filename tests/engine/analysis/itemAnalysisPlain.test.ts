/**
 * itemAnalysis() runs on the fast path (one compile, one grade, one category recomputed per item).
 * Its numbers must be exactly (===) those of the definition written out with the plain engine: the
 * rest mark of item i is gradeCourse(book, planWithout(plan, i)).students[s].weighted, the total
 * is gradeCourse(book, plan).students[s].weighted, r is Pearson's r over the students with an
 * earned score on the item and a mark (correlation.ts, checked against NIST StRD in
 * correlation.test.ts). Random courses from tests/engine/fast/arbitraries.ts, kept to those whose
 * earned item percents are finite (the difficulty mean rejects NaN/∞, on either path alike).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { itemAnalysis, planWithout } from '../../../renderer/engine/analysis/itemAnalysis';
import { pearson } from '../../../renderer/engine/analysis/correlation';
import { gradeCourse } from '../../../renderer/engine/grading';
import { courseArb } from '../fast/arbitraries';

describe('itemAnalysis equals the per-item regrade with the plain gradeCourse', () => {
  it('discrimination, item–total r and pairs on random courses', () => {
    fc.assert(
      fc.property(courseArb, ({ book, plan }) => {
        fc.pre(book.scores.every((row) => row.every((cell, ai) => cell.kind !== 'earned' || Number.isFinite((cell.points * 100) / book.assessments[ai]!.possible))));
        const rows = itemAnalysis(book, plan);
        const full = gradeCourse(book, plan).students;
        book.assessments.forEach((a, ai) => {
          const rest = gradeCourse(book, planWithout(plan, a.id)).students;
          const x: number[] = [];
          const y: number[] = [];
          const xFull: number[] = [];
          const yFull: number[] = [];
          book.students.forEach((_, si) => {
            const cell = book.scores[si]?.[ai];
            if (cell?.kind !== 'earned') return;
            const p = (cell.points * 100) / a.possible;
            const r = rest[si]?.weighted ?? null;
            if (r !== null) {
              x.push(p);
              y.push(r);
            }
            const f = full[si]?.weighted ?? null;
            if (f !== null) {
              xFull.push(p);
              yFull.push(f);
            }
          });
          const row = rows[ai]!;
          expect(row.assessmentId).toBe(a.id);
          expect(row.pairs, a.id).toBe(x.length);
          expect(row.discrimination, a.id).toStrictEqual(pearson(x, y));
          expect(row.itemTotal, a.id).toStrictEqual(pearson(xFull, yFull));
        });
      }),
      { numRuns: 300 },
    );
  });
});

/**
 * Properties that follow from the definitions (fast-check): Pearson's r is invariant under
 * positive affine maps of either variable and changes sign under a negative one (r is a
 * covariance over the product of SDs — any statistics text); the section statistics partition
 * the roster (every student is counted once: in some section's n or in its left-out counts).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { pearson } from '../../../renderer/engine/analysis/correlation';
import { sectionStatistics } from '../../../renderer/engine/analysis/sectionStatistics';
import { gradeCourse } from '../../../renderer/engine/grading/gradeCourse';
import type { Score } from '../../../renderer/engine/model';
import { book, EXCUSED, MISSING, onePlan, PENDING } from './fixtures';

const pairs = fc.array(fc.tuple(fc.integer({ min: 0, max: 100 }), fc.integer({ min: 0, max: 100 })), { minLength: 3, maxLength: 40 });

describe('pearson: affine invariance', () => {
  it('r(a·x + b, y) = sign(a)·r(x, y) whenever r is defined', () => {
    fc.assert(
      fc.property(pairs, fc.double({ min: 0.1, max: 10, noNaN: true }), fc.double({ min: -50, max: 50, noNaN: true }), fc.boolean(), (ps, a, b, negate) => {
        const x = ps.map((p) => p[0]);
        const y = ps.map((p) => p[1]);
        const r = pearson(x, y);
        const k = negate ? -a : a;
        const r2 = pearson(x.map((v) => k * v + b), y);
        expect(r2.defined).toBe(r.defined);
        if (r.defined && r2.defined) expect(r2.value).toBeCloseTo((negate ? -1 : 1) * r.value, 9);
      }),
    );
  });
});

describe('sectionStatistics: every student counted exactly once', () => {
  const cell = fc.oneof(
    fc.integer({ min: 0, max: 20 }).map((p): Score => ({ kind: 'earned', points: p })),
    fc.constant(MISSING),
    fc.constant(EXCUSED),
    fc.constant(PENDING),
  );
  const row = fc.tuple(fc.constantFrom('A', 'B', 'C'), cell);
  it('Σ section n = course n, and course n + left out = students, for an assessment', () => {
    fc.assert(
      fc.property(fc.array(row, { minLength: 1, maxLength: 30 }), (rows) => {
        const b = book([20], rows.map(([section, s], i) => [`P${i}`, section, s] as [string, string, Score]));
        const results = gradeCourse(b, onePlan(b)).students;
        const st = sectionStatistics(b, results, { measure: { kind: 'assessment', assessmentId: 'a1' } });
        const leftOut = st.leftOut.reduce((n, c) => n + c.count, 0);
        expect(st.sections.reduce((n, s) => n + s.summary.n, 0)).toBe(st.course.n);
        expect(st.course.n + leftOut).toBe(rows.length);
        expect(st.course.n).toBe(rows.filter(([, s]) => s.kind === 'earned').length);
        // The sections' roster indices partition the course's: each earned student exactly once.
        const fromSections = st.sections.flatMap((x) => x.studentIndices).sort((p, q) => p - q);
        expect(fromSections).toEqual([...st.courseStudentIndices].sort((p, q) => p - q));
        expect(new Set(fromSections).size).toBe(fromSections.length);
        expect(st.courseStudentIndices).toEqual(rows.flatMap(([, s], i) => (s.kind === 'earned' ? [i] : [])));
      }),
    );
  });
});

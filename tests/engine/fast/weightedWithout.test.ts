/**
 * weightedWithout must give exactly (===) the weighted percent of the plain engine graded with the
 * item taken out: gradeCourse(book, planWithout(plan, id)).students[s].weighted, for every
 * assessment of random courses (arbitraries.ts: drops, caps, extra credit, waivers, short rows,
 * both mark modes, ungraded items). The reference is gradeCourse, itself checked against
 * published sources in tests/engine/grading/.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { gradeCourse } from '../../../renderer/engine/grading';
import { compileCourse, gradeCompiled, planWithout, weightedWithout } from '../../../renderer/engine/fast';
import { courseArb } from './arbitraries';

describe('weightedWithout equals gradeCourse with planWithout', () => {
  it('for every assessment of random courses', () => {
    fc.assert(
      fc.property(courseArb, ({ book, plan }) => {
        const course = compileCourse(book, plan);
        const grades = gradeCompiled(course);
        for (const a of book.assessments) {
          const plain = gradeCourse(book, planWithout(plan, a.id)).students;
          const fast = weightedWithout(course, grades, book.assessments, a.id);
          plain.forEach((r, s) => {
            expect(fast.hasWeighted[s] === 1 ? fast.weighted[s] : null, `${a.id} student ${s}`).toBe(r.weighted);
          });
        }
      }),
      { numRuns: 300 },
    );
  });

  it('planWithout ungrades only the named item and leaves an ungraded or unknown item alone', () => {
    fc.assert(
      fc.property(courseArb, ({ book, plan }) => {
        for (const a of book.assessments) {
          const next = planWithout(plan, a.id);
          const rule = plan.items[a.id];
          if (rule === undefined || rule.categoryId === null) {
            expect(next).toBe(plan);
            continue;
          }
          expect(next.items[a.id]).toStrictEqual({ ...rule, categoryId: null });
          expect({ ...next, items: { ...next.items, [a.id]: rule } }).toStrictEqual(plan);
        }
        expect(planWithout(plan, 'no-such-item')).toBe(plan);
      }),
      { numRuns: 100 },
    );
  });
});

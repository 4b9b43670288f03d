/**
 * sectionStatistics(): the right values reach describe(), per section and pooled, with names as
 * outlier labels and the left-out cells counted. Expected quartiles and outlier verdicts come from
 * REFERENCES.md (Hyndman & Fan 1996 tables; Tukey 1977 box-plot example) — not from the engine.
 */
import { describe, expect, it } from 'vitest';
import { outlierStudents, sectionStatistics } from '../../../renderer/engine/analysis/sectionStatistics';
import { describeLeftOut, leftOutTotal } from '../../../renderer/engine/analysis/measure';
import type { Defined } from '../../../renderer/engine/defined';
import { gradeCourse } from '../../../renderer/engine/grading/gradeCourse';
import type { Score } from '../../../renderer/engine/model';
import { book, earned, EXCUSED, MISSING, onePlan } from './fixtures';

function value<T>(d: Defined<T>): T {
  if (!d.defined) throw new Error(`expected a defined value, got: ${d.reason}`);
  return d.value;
}

// Section "North": the box-plot example of REFERENCES.md (points out of 100 = item percent).
const north = [47, 60, 62, 64, 65, 67, 69, 72, 73, 80];
// Section "South": the second Hyndman & Fan example, plus one missing and one excused cell.
const south = [6, 7, 15, 36, 39, 40, 41, 42, 43, 47, 49];
const rows: [string, string, Score][] = [
  ...south.map((p, i) => [`South ${i}`, 'South', earned(p)] as [string, string, Score]),
  ['South missing', 'South', MISSING],
  ['South excused', 'South', EXCUSED],
  ...north.map((p, i) => [i === 0 ? 'Ada Low' : `North ${i}`, 'North', earned(p)] as [string, string, Score]),
];
const b = book([100], rows);
const plan = onePlan(b, { missingAs: 'excluded' });
const results = gradeCourse(b, plan).students;

describe('sectionStatistics on one assessment', () => {
  const measure = { kind: 'assessment', assessmentId: 'a1' } as const;

  it('sections in natural order, each with its own values; the course pools them', () => {
    const s = sectionStatistics(b, results, { measure });
    expect(s.sections.map((x) => x.section)).toEqual(['North', 'South']);
    expect(s.sections[0]!.values).toEqual(north);
    expect(s.sections[1]!.values).toEqual(south);
    expect(s.course.n).toBe(21);
    expect(s.label).toBe('Item 1 (% of 100 points)');
  });

  it('type 7 (default): North Q1 62.5, Q3 71.25, fences 49.375/84.375, outlier 47 named "Ada Low" (REFERENCES.md box plots)', () => {
    const n = sectionStatistics(b, results, { measure }).sections[0]!.summary;
    expect(n.quantileType).toBe(7);
    expect(value(n.q1)).toBeCloseTo(62.5, 12);
    expect(value(n.q3)).toBeCloseTo(71.25, 12);
    expect(value(n.lowerFence)).toBeCloseTo(49.375, 12);
    expect(n.outliers.map((o) => [o.label, o.value, o.side])).toEqual([['Ada Low', 47, 'low']]);
  });

  it('type 6: North fences 45.375/88.375 and no outlier (REFERENCES.md box plots)', () => {
    const n = sectionStatistics(b, results, { measure, quantileType: 6 }).sections[0]!.summary;
    expect(value(n.lowerFence)).toBeCloseTo(45.375, 12);
    expect(value(n.upperFence)).toBeCloseTo(88.375, 12);
    expect(n.outliers).toEqual([]);
  });

  it('South quartiles follow the Hyndman & Fan table for every type', () => {
    // REFERENCES.md, x = 6, 7, 15, 36, 39, 40, 41, 42, 43, 47, 49 [src].
    const q1 = [15, 15, 15, 13, 20.25, 15, 25.5, 18.5, 18.9375];
    const q3 = [43, 43, 42, 42.25, 42.75, 43, 42.5, 257 / 6, 42.8125];
    for (const t of [1, 2, 3, 4, 5, 6, 7, 8, 9] as const) {
      const s = sectionStatistics(b, results, { measure, quantileType: t }).sections[1]!.summary;
      expect(value(s.q1)).toBeCloseTo(q1[t - 1]!, 12);
      expect(value(s.q3)).toBeCloseTo(q3[t - 1]!, 12);
      expect(s.quantileMethod).toMatch(new RegExp(`type ${t}\\b`));
    }
  });

  it('missing and excused cells are left out and counted, per section and for the course', () => {
    const s = sectionStatistics(b, results, { measure });
    expect(s.leftOut).toEqual([{ reason: 'missing', count: 1 }, { reason: 'excused', count: 1 }]);
    expect(s.sections[1]!.leftOut).toEqual(s.leftOut);
    expect(s.sections[0]!.leftOut).toEqual([]);
    expect(describeLeftOut(s.leftOut)).toBe('1 missing (no submission), 1 excused');
  });

  it('South sample SD is 15.873362478178224 (REFERENCES.md exact fixture)', () => {
    const s = sectionStatistics(b, results, { measure }).sections[1]!.summary;
    expect(value(s.sampleSd)).toBeCloseTo(15.873362478178224, 12);
  });
});

describe('sectionStatistics on final marks and on a category', () => {
  it('final marks: the rounded finals; students without a mark are left out as "no mark"', () => {
    const s = sectionStatistics(b, results, { measure: { kind: 'final' } });
    // One item of 100 points, missing excluded: the final is the item percent; the missing and
    // the excused student have no category that counts, hence no mark.
    expect(s.sections[1]!.values).toEqual(south);
    expect(s.leftOut).toEqual([{ reason: 'noMark', count: 2 }]);
  });

  it('category: the category percent; not-graded students are left out', () => {
    const s = sectionStatistics(b, results, { measure: { kind: 'category', categoryId: 'all' } });
    expect(s.sections[0]!.values).toEqual(north);
    expect(s.leftOut).toEqual([{ reason: 'nothingGraded', count: 2 }]);
  });

  it('an unknown assessment or category is a clear error', () => {
    expect(() => sectionStatistics(b, results, { measure: { kind: 'assessment', assessmentId: 'nope' } })).toThrow(/no assessment with id "nope"/);
    expect(() => sectionStatistics(b, results, { measure: { kind: 'category', categoryId: 'nope' } })).toThrow(/no category with id "nope"/);
  });
});

describe('sectionStatistics: roster indices, for callers that label students their own way', () => {
  const measure = { kind: 'assessment', assessmentId: 'a1' } as const;

  it('studentIndices point at the roster row of every value, per section and pooled', () => {
    const s = sectionStatistics(b, results, { measure });
    const groups = [
      ...s.sections.map((g) => ({ section: g.section as string | null, values: g.values, names: g.names, indices: g.studentIndices })),
      { section: null, values: s.courseValues, names: s.courseNames, indices: s.courseStudentIndices },
    ];
    for (const g of groups) {
      expect(g.indices.length).toBe(g.values.length);
      g.indices.forEach((i, k) => {
        const student = b.students[i]!;
        expect(student.name).toBe(g.names[k]);
        if (g.section !== null) expect(student.section).toBe(g.section);
        // The value is that student's own item percent (points out of 100 here).
        expect(b.scores[i]![0]).toEqual(earned(g.values[k]!));
      });
    }
    // The missing and the excused student are in no group's indices.
    const missing = b.students.findIndex((x) => x.name === 'South missing');
    const excused = b.students.findIndex((x) => x.name === 'South excused');
    expect(s.courseStudentIndices).not.toContain(missing);
    expect(s.courseStudentIndices).not.toContain(excused);
  });

  it('outlierStudents finds the box-plot outlier 47 on the roster (REFERENCES.md box plots, type 7)', () => {
    const north = sectionStatistics(b, results, { measure }).sections[0]!;
    const ada = b.students.findIndex((x) => x.name === 'Ada Low');
    expect(outlierStudents(north.summary, north.studentIndices)).toEqual([{ studentIndex: ada, value: 47, side: 'low' }]);
    // Type 6 fences 45.375 / 88.375: no outlier, so no student either.
    const six = sectionStatistics(b, results, { measure, quantileType: 6 }).sections[0]!;
    expect(outlierStudents(six.summary, six.studentIndices)).toEqual([]);
  });

  it('outlierStudents refuses indices that belong to a smaller group', () => {
    const north = sectionStatistics(b, results, { measure }).sections[0]!;
    expect(() => outlierStudents(north.summary, [])).toThrow(/pass the indices of the same group/);
  });

  it('leftOutTotal adds the left-out counts over every reason', () => {
    const s = sectionStatistics(b, results, { measure });
    expect(leftOutTotal(s.leftOut)).toBe(2);
    expect(leftOutTotal(s.sections[0]!.leftOut)).toBe(0);
    // Every roster row is either a value or left out.
    expect(s.courseStudentIndices.length + leftOutTotal(s.leftOut)).toBe(b.students.length);
  });
});

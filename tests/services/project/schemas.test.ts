import { describe, expect, it } from 'vitest';
import { courseProjectSchema, exportRequestSchema, formatPath, gradebookSchema, gradingPlanSchema, scoreSchema } from '../../../main/services/schemas';
import { sampleProject } from './sampleProject';

describe('schemas', () => {
  it('accept a complete, consistent course', () => {
    const result = courseProjectSchema.safeParse(sampleProject());
    expect(result.success).toBe(true);
  });

  it('refuse unknown keys at every level (strict objects)', () => {
    const p = sampleProject();
    expect(courseProjectSchema.safeParse({ ...p, extra: 1 }).success).toBe(false);
    const withStudentKey = { ...p, gradebook: { ...p.gradebook, students: [{ ...p.gradebook.students[0], grade: 'A' }, ...p.gradebook.students.slice(1)] } };
    const r = courseProjectSchema.safeParse(withStudentKey);
    expect(r.success).toBe(false);
    if (!r.success) expect(formatPath(r.error.issues[0]!.path)).toBe('gradebook.students[0]');
    expect(scoreSchema.safeParse({ kind: 'missing', points: 3 }).success).toBe(false);
  });

  it('check the score grid is students × assessments', () => {
    const book = sampleProject().gradebook;
    const shortRow = { ...book, scores: [book.scores[0]!, book.scores[1]!.slice(0, 2), book.scores[2]!] };
    const r = gradebookSchema.safeParse(shortRow);
    expect(r.success).toBe(false);
    if (!r.success) {
      expect(r.error.issues[0]!.path).toEqual(['scores', 1]);
      expect(r.error.issues[0]!.message).toContain('2 cells but there are 3 assessments');
    }
    const missingRow = { ...book, scores: book.scores.slice(0, 2) };
    const r2 = gradebookSchema.safeParse(missingRow);
    expect(r2.success).toBe(false);
    if (!r2.success) expect(r2.error.issues[0]!.message).toContain('2 rows but there are 3 students');
  });

  it('refuse duplicate student, assessment, category ids and letters', () => {
    const p = sampleProject();
    const book = p.gradebook;
    const dupStudent = { ...book, students: [book.students[0]!, { ...book.students[1]!, id: 'S1' }, book.students[2]!] };
    const r = gradebookSchema.safeParse(dupStudent);
    expect(r.success).toBe(false);
    if (!r.success) expect(r.error.issues.map((i) => i.message)).toContain('Student ID "S1" appears more than once; IDs must be unique.');
    const dupAssessment = { ...book, assessments: [book.assessments[0]!, { ...book.assessments[1]!, id: 'Q1' }, book.assessments[2]!] };
    expect(gradebookSchema.safeParse(dupAssessment).success).toBe(false);
    const dupCategory = { ...p.plan, categories: [p.plan.categories[0]!, { ...p.plan.categories[1]!, id: 'quiz' }] };
    expect(gradingPlanSchema.safeParse(dupCategory).success).toBe(false);
    const dupLetter = { ...p.plan, scale: { name: 'x', cutoffs: [{ letter: 'A', minPercent: 90 }, { letter: 'A', minPercent: 80 }] } };
    expect(gradingPlanSchema.safeParse(dupLetter).success).toBe(false);
  });

  it('refuse out-of-range numbers', () => {
    const p = sampleProject();
    const bad = [
      { ...p.plan, categories: [{ ...p.plan.categories[0]!, weight: -1 }] },
      { ...p.plan, categories: [{ ...p.plan.categories[0]!, dropLowest: 1.5 }] },
      { ...p.plan, rounding: { decimals: -1 } },
      { ...p.plan, scale: { name: 'empty', cutoffs: [] } },
    ];
    for (const plan of bad) expect(gradingPlanSchema.safeParse(plan).success).toBe(false);
    expect(scoreSchema.safeParse({ kind: 'earned', points: Number.NaN }).success).toBe(false);
    expect(scoreSchema.safeParse({ kind: 'earned', points: Number.POSITIVE_INFINITY }).success).toBe(false);
    const zeroPossible = { ...p.gradebook, assessments: [{ ...p.gradebook.assessments[0]!, possible: 0 }, ...p.gradebook.assessments.slice(1)] };
    expect(gradebookSchema.safeParse(zeroPossible).success).toBe(false);
    // Negative earned points are data the import reports; the model can hold them.
    expect(scoreSchema.safeParse({ kind: 'earned', points: -2 }).success).toBe(true);
  });

  it('refuse prototype keys in records and leave Object.prototype untouched', () => {
    const text = JSON.stringify(sampleProject().plan).replace('"items":{', '"items":{"__proto__":{"categoryId":"quiz","extraCredit":true,"polluted":true},');
    const raw: unknown = JSON.parse(text);
    // zod 4 skips an own `__proto__` key of a record (the file reader refuses such files outright:
    // see projectFile.test.ts); either way nothing reaches the prototype.
    const r = gradingPlanSchema.safeParse(raw);
    expect(r.success).toBe(true);
    if (r.success) {
      expect(Object.getPrototypeOf(r.data.items)).toBe(Object.prototype);
      expect(Object.keys(r.data.items)).toEqual(['Q1', 'Q2', 'EX']);
    }
    expect(({} as Record<string, unknown>)['polluted']).toBeUndefined();
    expect(Object.prototype).not.toHaveProperty('categoryId');
    const ctor = gradingPlanSchema.safeParse({ ...sampleProject().plan, items: { constructor: { categoryId: null, extraCredit: false } } });
    expect(ctor.success).toBe(false);
  });

  it('validate export requests', () => {
    const request = {
      path: '/tmp/x.csv',
      format: 'csv',
      project: sampleProject(),
      columns: [{ field: 'id', header: 'ID' }],
      include: { breakdown: false, sectionStatistics: false, assessmentStatistics: false },
      overwrite: false,
    };
    expect(exportRequestSchema.safeParse(request).success).toBe(true);
    expect(exportRequestSchema.safeParse({ ...request, format: 'pdf' }).success).toBe(false);
    expect(exportRequestSchema.safeParse({ ...request, columns: [{ field: 'password', header: 'x' }] }).success).toBe(false);
  });
});

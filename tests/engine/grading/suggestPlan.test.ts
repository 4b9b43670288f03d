import { describe, expect, it } from 'vitest';
import { baseName, categoryNameFor, equalWeights, suggestPlan } from '../../../renderer/engine/grading/suggestPlan';
import { checkPlan } from '../../../renderer/engine/grading/checkPlan';
import { DEFAULT_SCALE } from '../../../renderer/engine/grading/gradeScale';
import type { Gradebook } from '../../../renderer/engine/model';

// Category words (quiz, exam, homework, lab, project) are trade vocabulary — common practice, no source.

describe('suggestPlan', () => {
  it('strips trailing numbers and groups by trade words', () => {
    expect(baseName('Quiz 3')).toBe('Quiz');
    expect(baseName('HW03')).toBe('HW');
    expect(baseName('Lab #2')).toBe('Lab');
    expect(baseName('Essay (2)')).toBe('Essay');
    expect(baseName('Midterm')).toBe('Midterm');
    expect(baseName('2024')).toBe('2024');
    expect(categoryNameFor('Quiz 3')).toBe('Quizzes');
    expect(categoryNameFor('Midterm')).toBe('Exams');
    expect(categoryNameFor('Final exam')).toBe('Exams');
    expect(categoryNameFor('Final project')).toBe('Projects');
    expect(categoryNameFor('HW 1')).toBe('Homework');
    expect(categoryNameFor('Lab 4')).toBe('Labs');
    expect(categoryNameFor('Participation')).toBe('Participation');
  });

  it('equal weights of two decimals summing to 100', () => {
    expect(equalWeights(3)).toEqual([33.33, 33.33, 33.34]);
    expect(equalWeights(4)).toEqual([25, 25, 25, 25]);
    expect(equalWeights(7).reduce((s, w) => s + w * 100, 0)).toBe(10_000);
    expect(equalWeights(0)).toEqual([]);
  });

  it('a whole plan: categories in first-seen order, every assessment placed, defaults stated', () => {
    const names = ['Quiz 1', 'HW 1', 'Quiz 2', 'Midterm', 'Participation', 'Final exam'];
    const book: Gradebook = {
      students: [{ id: 's', name: 'S', section: 'A' }],
      assessments: names.map((name, i) => ({ id: `c${i}`, name, possible: 10 })),
      scores: [names.map(() => ({ kind: 'missing' as const }))],
    };
    const p = suggestPlan(book);
    expect(p.categories.map((c) => [c.id, c.name, c.weight])).toEqual([
      ['quizzes', 'Quizzes', 25],
      ['homework', 'Homework', 25],
      ['exams', 'Exams', 25],
      ['participation', 'Participation', 25],
    ]);
    expect(p.items).toEqual({
      c0: { categoryId: 'quizzes', extraCredit: false },
      c1: { categoryId: 'homework', extraCredit: false },
      c2: { categoryId: 'quizzes', extraCredit: false },
      c3: { categoryId: 'exams', extraCredit: false },
      c4: { categoryId: 'participation', extraCredit: false },
      c5: { categoryId: 'exams', extraCredit: false },
    });
    expect(p.markMode).toBe('current');
    expect(p.rounding).toEqual({ decimals: 0 });
    expect(p.scale).toBe(DEFAULT_SCALE);
    expect(checkPlan(book, p)).toEqual([]);
  });

  it('distinct names with the same slug get distinct ids', () => {
    const book: Gradebook = {
      students: [],
      assessments: [
        { id: 'a', name: 'Peer review', possible: 5 },
        { id: 'b', name: 'Peer-review!', possible: 5 },
      ],
      scores: [],
    };
    expect(suggestPlan(book).categories.map((c) => c.id)).toEqual(['peer-review', 'peer-review-2']);
  });
});

import { describe, expect, it } from 'vitest';
import { describeLine, formatNumber } from '../../../renderer/engine/grading/explain';
import { gradeCourse } from '../../../renderer/engine/grading/gradeCourse';
import type { ExplanationLine } from '../../../renderer/engine/results';
import { book, category, E, EXC, MISS, PEND, plan, type Column } from './helpers';

const names = {
  category: (id: string) => ({ quizzes: 'Quizzes', exams: 'Exams' })[id] ?? id,
  assessment: (id: string) => id.toUpperCase(),
};

describe('describeLine', () => {
  it('one sentence for every line of a real explanation', () => {
    const cols: Column[] = [
      { id: 'q1', possible: 10, categoryId: 'quizzes' },
      { id: 'q2', possible: 10, categoryId: 'quizzes' },
      { id: 'q3', possible: 10, categoryId: 'quizzes' },
      { id: 'q4', possible: 10, categoryId: 'quizzes' },
      { id: 'bonus', possible: 5, categoryId: 'quizzes', extraCredit: true },
      { id: 'mid', possible: 50, categoryId: 'exams' },
    ];
    const b = book(cols, [{ student: { id: 's1' }, scores: [E(4), E(8), EXC, MISS, E(2), PEND] }]);
    const p = plan(cols, [category('quizzes', 40, { dropLowest: 1, capPercent: 100 }), category('exams', 60)], {
      adjustments: [{ kind: 'addPoints', section: null, points: 2 }],
    });
    const r = gradeCourse(b, p).students[0]!;
    const text = r.lines.map((l) => describeLine(l, names));
    expect(text).toEqual([
      'Q1: 4 of 10 points (40 %), counted.',
      'Q2: 8 of 10 points (80 %), counted.',
      'Q3: excused, so it is not counted at all.',
      'Q4: 0 of 10 points (0 %), dropped by the drop-lowest rule.',
      'BONUS: extra credit, 2 points added to the category without adding to its points possible.',
      // (4 + 8 + 2)/20 = 70 %
      'Quizzes scores 70 % by total points, after dropping 1 item; weight 40 becomes 100 % of the mark, adding 70 points to the mark.',
      'MID: not marked yet, left out of the current mark.',
      'Exams has nothing graded yet, so it is left out and its weight goes to the other categories.',
      'The weighted percent is 70 %.',
      'Adding 2 points for the whole course takes 70 % to 72 %.',
      'Rounded half-up to 2 decimals: 72 % becomes 72 %.',
      'That is at or above the 70 % cutoff for C- (1.7 grade points).',
    ]);
  });

  it('the remaining statuses', () => {
    const item = (status: Extract<ExplanationLine, { kind: 'item' }>['status'], earned: number | null): ExplanationLine => ({
      kind: 'item', assessmentId: 'q9', categoryId: 'quizzes', status, earned, possible: 10, percent: earned === null ? null : earned * 10,
    });
    expect(describeLine(item('missingZero', 0), names)).toBe('Q9: missing, counted as 0 of 10 points.');
    expect(describeLine(item('missingExcluded', null), names)).toBe("Q9: missing, left out by this category's rule.");
    expect(describeLine(item('pendingZero', 0), names)).toBe('Q9: not marked yet, counted as 0 of 10 points in the projected final.');
    const cat = (status: Extract<ExplanationLine, { kind: 'category' }>['status']): ExplanationLine => ({
      kind: 'category', categoryId: 'exams', status, combine: 'equalItems', percent: null, uncappedPercent: null,
      capped: false, nominalWeight: 60, effectiveWeight: 0, contribution: null, dropped: 0,
    });
    expect(describeLine(cat('droppedForCourse'), names)).toBe('Exams is dropped for the whole course, so its weight goes to the other categories.');
    expect(describeLine(cat('waivedForSection'), names)).toBe('Exams is waived for this section, so its weight goes to the other categories.');
    expect(describeLine(cat('waivedForStudent'), names)).toBe('Exams is waived for this student, so its weight goes to the other categories.');
    expect(
      describeLine({ ...(cat('counted') as Extract<ExplanationLine, { kind: 'category' }>), percent: 100, uncappedPercent: 112.5, capped: true, effectiveWeight: 60, contribution: 60 }, names),
    ).toBe('Exams scores 100 % (112.5 %, capped) by the mean of item percents; weight 60 becomes 60 % of the mark, adding 60 points to the mark.');
    expect(describeLine({ kind: 'adjustment', adjustment: { kind: 'scaleToMean', section: 'B', targetMean: 75 }, before: 60, after: 66.123456 }, names)).toBe(
      'Scaling section B so its mean becomes 75 % takes 60 % to 66.1235 %.',
    );
    expect(describeLine({ kind: 'adjustment', adjustment: { kind: 'cap', section: null, maxPercent: 100 }, before: 104, after: 100 }, names)).toBe(
      'Capping the whole course at 100 % takes 104 % to 100 %.',
    );
    expect(describeLine({ kind: 'cutoff', letter: 'Pass', minPercent: 60, gradePoints: null }, names)).toBe('That is at or above the 60 % cutoff for Pass.');
    expect(describeLine({ kind: 'noMark', reason: 'Because.' }, names)).toBe('Because.');
  });

  it('formatNumber shows at most two decimals, half-up', () => {
    expect(formatNumber(83.33333)).toBe('83.33');
    expect(formatNumber(2.675)).toBe('2.68');
    expect(formatNumber(90)).toBe('90');
  });
});

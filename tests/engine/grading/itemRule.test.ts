import { describe, expect, it } from 'vitest';
import { gradeCourse } from '../../../renderer/engine/grading/gradeCourse';
import { itemRuleFor } from '../../../renderer/engine/grading/itemRule';
import { suggestPlan } from '../../../renderer/engine/grading/suggestPlan';
import type { Gradebook } from '../../../renderer/engine/model';

// Assessment ids are spreadsheet header text, so names of Object.prototype members must behave
// like any other name (no inherited rule, no prototype change).
const book: Gradebook = {
  students: [{ id: 's1', name: 'One', section: 'A' }],
  assessments: [
    { id: 'constructor', name: 'constructor', possible: 10 },
    { id: '__proto__', name: '__proto__', possible: 10 },
    { id: 'toString', name: 'toString', possible: 10 },
  ],
  scores: [[{ kind: 'earned', points: 5 }, { kind: 'earned', points: 10 }, { kind: 'earned', points: 0 }]],
};

describe('itemRuleFor', () => {
  it('ignores inherited keys', () => {
    expect(itemRuleFor({ items: {} }, 'constructor')).toBeUndefined();
    expect(itemRuleFor({ items: {} }, 'toString')).toBeUndefined();
    expect(itemRuleFor({ items: {} }, '__proto__')).toBeUndefined();
  });

  it('suggestPlan keys every assessment as an own property, "__proto__" included', () => {
    const plan = suggestPlan(book);
    expect(Object.keys(plan.items).sort()).toEqual(['__proto__', 'constructor', 'toString']);
    expect(Object.getPrototypeOf(plan.items)).toBe(Object.prototype);
    for (const a of book.assessments) expect(itemRuleFor(plan, a.id)?.categoryId).not.toBeNull();
    // Each is its own category ("constructor", "__proto__", "toString" share no base name), equal
    // weights; total points: (5 + 10 + 0) / 3 items of 10 → mean of 50 %, 100 %, 0 % = 50 %.
    const r = gradeCourse(book, plan).students[0]!;
    expect(r.final).toBe(50);
  });

  it('gradeCourse with an empty plan grades nothing and does not trip on inherited names', () => {
    const plan = { ...suggestPlan(book), items: {} };
    const result = gradeCourse(book, plan);
    expect(result.students[0]!.final).toBeNull();
    expect(result.planProblems.filter((p) => p.includes('is in no category'))).toHaveLength(3);
  });
});

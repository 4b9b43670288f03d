// Plan edits are our own contract (no outside source): each function returns a new plan with exactly
// the stated change, never mutates its input, and refuses values the plan cannot hold.
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import type { GradingPlan } from '../../renderer/engine/model';
import * as edits from '../../renderer/state/planEdits';

function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object') {
    for (const v of Object.values(value)) deepFreeze(v);
    Object.freeze(value);
  }
  return value;
}

function basePlan(): GradingPlan {
  return deepFreeze({
    categories: [
      { id: 'hw', name: 'Homework', weight: 30, combine: 'equalItems', dropLowest: 1, missingAs: 'zero', capPercent: null, droppedForCourse: false },
      { id: 'ex', name: 'Exams', weight: 70, combine: 'totalPoints', dropLowest: 0, missingAs: 'zero', capPercent: 100, droppedForCourse: false },
    ],
    items: {
      h1: { categoryId: 'hw', extraCredit: false },
      h2: { categoryId: 'hw', extraCredit: false },
      bonus: { categoryId: 'ex', extraCredit: true },
      e1: { categoryId: 'ex', extraCredit: false },
    },
    sectionWaivers: [{ section: 'A', categoryId: 'hw', note: 'lab closed' }],
    studentWaivers: [{ studentId: 's1', categoryId: 'ex' }],
    markMode: 'current',
    scale: { name: 'Letters', cutoffs: [{ letter: 'A', minPercent: 90, gradePoints: 4 }, { letter: 'F', minPercent: 0, gradePoints: 0 }] },
    rounding: { decimals: 0 },
    adjustments: [
      { kind: 'addPoints', section: 'A', points: 2 },
      { kind: 'cap', section: null, maxPercent: 100 },
    ],
  } satisfies GradingPlan);
}

describe('categories', () => {
  it('adds a neutral category with a fresh id and leaves the input untouched', () => {
    const plan = basePlan();
    const next = edits.addCategory(plan, '  Quizzes ');
    expect(next.categories).toHaveLength(3);
    expect(next.categories[2]).toEqual({
      id: 'cat-3', name: 'Quizzes', weight: 0, combine: 'totalPoints', dropLowest: 0, missingAs: 'zero', capPercent: null, droppedForCourse: false,
    });
    expect(plan.categories).toHaveLength(2);
    expect(edits.freshCategoryId(edits.addCategory(next, 'More'))).toBe('cat-5');
  });

  it('skips ids already in use', () => {
    const plan = edits.addCategory(basePlan(), 'X', 'cat-3');
    expect(edits.freshCategoryId(plan)).toBe('cat-4');
    expect(() => edits.addCategory(plan, 'Y', 'cat-3')).toThrow(/already used/);
  });

  it('refuses an empty name', () => {
    expect(() => edits.addCategory(basePlan(), '   ')).toThrow(/needs a name/);
    expect(() => edits.renameCategory(basePlan(), 'hw', '')).toThrow(/needs a name/);
  });

  it('renames only the named category', () => {
    const next = edits.renameCategory(basePlan(), 'hw', 'Problem sets');
    expect(next.categories.map((c) => c.name)).toEqual(['Problem sets', 'Exams']);
    expect(() => edits.renameCategory(basePlan(), 'nope', 'x')).toThrow(/No category with id "nope"/);
  });

  it('removing a category un-grades its items and drops waivers that name it', () => {
    const next = edits.removeCategory(basePlan(), 'hw');
    expect(next.categories.map((c) => c.id)).toEqual(['ex']);
    expect(next.items['h1']).toEqual({ categoryId: null, extraCredit: false });
    expect(next.items['bonus']).toEqual({ categoryId: 'ex', extraCredit: true });
    expect(next.sectionWaivers).toEqual([]);
    expect(next.studentWaivers).toEqual([{ studentId: 's1', categoryId: 'ex' }]);
  });

  it('never leaves a reference to a removed category (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom('hw', 'ex'), { maxLength: 2 }), (toRemove) => {
        let plan = basePlan();
        for (const id of new Set(toRemove)) plan = edits.removeCategory(plan, id);
        const ids = new Set(plan.categories.map((c) => c.id));
        for (const rule of Object.values(plan.items)) expect(rule.categoryId === null || ids.has(rule.categoryId)).toBe(true);
        for (const w of plan.sectionWaivers) expect(ids.has(w.categoryId)).toBe(true);
        for (const w of plan.studentWaivers) expect(ids.has(w.categoryId)).toBe(true);
      }),
    );
  });

  it('sets rules and checks them', () => {
    const plan = basePlan();
    const next = edits.setCategoryRules(plan, 'ex', { dropLowest: 2, missingAs: 'excluded', capPercent: null, droppedForCourse: true });
    expect(next.categories[1]).toMatchObject({ dropLowest: 2, missingAs: 'excluded', capPercent: null, droppedForCourse: true, weight: 70 });
    // The untouched category is shared, not copied (cheap undo history).
    expect(next.categories[0]).toBe(plan.categories[0]);
    expect(edits.setCategoryWeight(basePlan(), 'hw', 12.5).categories[0]?.weight).toBe(12.5);
    expect(edits.setCombineRule(basePlan(), 'hw', 'totalPoints').categories[0]?.combine).toBe('totalPoints');
    expect(() => edits.setCategoryWeight(basePlan(), 'hw', -1)).toThrow(/weight must be a number ≥ 0/);
    expect(() => edits.setCategoryWeight(basePlan(), 'hw', Number.NaN)).toThrow(/weight/);
    expect(() => edits.setCategoryRules(basePlan(), 'hw', { dropLowest: 1.5 })).toThrow(/whole number/);
    expect(() => edits.setCategoryRules(basePlan(), 'hw', { capPercent: 0 })).toThrow(/cap must be a percent > 0/);
  });

  it('moves a category within bounds', () => {
    expect(edits.moveCategory(basePlan(), 'ex', -1).categories.map((c) => c.id)).toEqual(['ex', 'hw']);
    const plan = basePlan();
    expect(edits.moveCategory(plan, 'hw', -1)).toBe(plan);
  });

  it('sums nominal weights of categories that are not dropped for the course', () => {
    expect(edits.nominalWeightSum(basePlan())).toBe(100);
    expect(edits.nominalWeightSum(edits.setCategoryRules(basePlan(), 'hw', { droppedForCourse: true }))).toBe(70);
  });
});

describe('assessments', () => {
  it('assigns to a category keeping the extra-credit flag', () => {
    const next = edits.assignAssessment(basePlan(), 'bonus', 'hw');
    expect(next.items['bonus']).toEqual({ categoryId: 'hw', extraCredit: true });
    expect(edits.assignAssessment(basePlan(), 'e1', null).items['e1']).toEqual({ categoryId: null, extraCredit: false });
  });

  it('creates a rule for an assessment that had none', () => {
    expect(edits.assignAssessment(basePlan(), 'new', 'ex').items['new']).toEqual({ categoryId: 'ex', extraCredit: false });
    expect(edits.setExtraCredit(basePlan(), 'other', true).items['other']).toEqual({ categoryId: null, extraCredit: true });
  });

  it('refuses an unknown category', () => {
    expect(() => edits.assignAssessment(basePlan(), 'h1', 'zz')).toThrow(/No category/);
  });

  it('toggles extra credit', () => {
    expect(edits.setExtraCredit(basePlan(), 'bonus', false).items['bonus']).toEqual({ categoryId: 'ex', extraCredit: false });
  });
});

describe('waivers', () => {
  it('adds a section waiver once, with a trimmed note', () => {
    const next = edits.addSectionWaiver(basePlan(), 'B', 'ex', '  field trip ');
    expect(next.sectionWaivers).toEqual([
      { section: 'A', categoryId: 'hw', note: 'lab closed' },
      { section: 'B', categoryId: 'ex', note: 'field trip' },
    ]);
    expect(edits.addSectionWaiver(next, 'B', 'ex', 'again')).toBe(next);
    expect(edits.addSectionWaiver(basePlan(), 'C', 'hw').sectionWaivers[1]).toEqual({ section: 'C', categoryId: 'hw' });
    expect(() => edits.addSectionWaiver(basePlan(), 'B', 'zz')).toThrow(/No category/);
  });

  it('edits and removes a section waiver', () => {
    expect(edits.setSectionWaiverNote(basePlan(), 'A', 'hw', '').sectionWaivers).toEqual([{ section: 'A', categoryId: 'hw' }]);
    expect(edits.setSectionWaiverNote(basePlan(), 'A', 'hw', 'x').sectionWaivers).toEqual([{ section: 'A', categoryId: 'hw', note: 'x' }]);
    expect(edits.removeSectionWaiver(basePlan(), 'A', 'hw').sectionWaivers).toEqual([]);
    expect(edits.removeSectionWaiver(basePlan(), 'A', 'ex').sectionWaivers).toHaveLength(1);
  });

  it('adds, edits and removes a student waiver', () => {
    const next = edits.addStudentWaiver(basePlan(), 's2', 'hw', 'medical');
    expect(next.studentWaivers[1]).toEqual({ studentId: 's2', categoryId: 'hw', note: 'medical' });
    expect(edits.addStudentWaiver(next, 's2', 'hw')).toBe(next);
    expect(edits.setStudentWaiverNote(next, 's2', 'hw', 'moved').studentWaivers[1]).toEqual({ studentId: 's2', categoryId: 'hw', note: 'moved' });
    expect(edits.removeStudentWaiver(next, 's1', 'ex').studentWaivers).toEqual([{ studentId: 's2', categoryId: 'hw', note: 'medical' }]);
  });
});

describe('mark mode and rounding', () => {
  it('sets the mark mode', () => {
    expect(edits.setMarkMode(basePlan(), 'projected').markMode).toBe('projected');
  });

  it('sets decimals 0–4 and refuses others', () => {
    expect(edits.setRoundingDecimals(basePlan(), 2).rounding).toEqual({ decimals: 2 });
    for (const bad of [-1, 5, 1.5, Number.NaN]) expect(() => edits.setRoundingDecimals(basePlan(), bad)).toThrow(/0 to 4 decimal places/);
  });
});

describe('grade scale', () => {
  it('replaces the scale with a copy', () => {
    const preset = { name: 'Pass/fail', cutoffs: [{ letter: 'P', minPercent: 50, passing: true }, { letter: 'F', minPercent: 0 }] };
    const next = edits.setScale(basePlan(), preset);
    expect(next.scale).toEqual(preset);
    expect(next.scale.cutoffs[0]).not.toBe(preset.cutoffs[0]);
    expect(edits.renameScale(basePlan(), 'Mine').scale.name).toBe('Mine');
  });

  it('updates, adds and removes cutoffs', () => {
    const updated = edits.updateCutoff(basePlan(), 0, { minPercent: 89.5 });
    expect(updated.scale.cutoffs[0]).toEqual({ letter: 'A', minPercent: 89.5, gradePoints: 4 });
    const noPoints = edits.updateCutoff(basePlan(), 0, { gradePoints: undefined });
    expect(noPoints.scale.cutoffs[0]).toEqual({ letter: 'A', minPercent: 90 });
    const added = edits.addCutoff(basePlan(), { letter: 'B', minPercent: 80, gradePoints: 3 });
    expect(added.scale.cutoffs.map((c) => c.letter)).toEqual(['A', 'F', 'B']);
    expect(edits.removeCutoff(added, 1).scale.cutoffs.map((c) => c.letter)).toEqual(['A', 'B']);
    expect(() => edits.removeCutoff(basePlan(), 2)).toThrow(/No cutoff at position 3; the scale has 2/);
    expect(() => edits.updateCutoff(basePlan(), 0, { minPercent: Number.NaN })).toThrow(/minimum must be a number/);
  });
});

describe('adjustments', () => {
  it('adds, replaces, moves and removes in order', () => {
    const added = edits.addAdjustment(basePlan(), { kind: 'scaleToMean', section: 'B', targetMean: 75 });
    expect(added.adjustments.map((a) => a.kind)).toEqual(['addPoints', 'cap', 'scaleToMean']);
    const moved = edits.moveAdjustment(added, 2, -1);
    expect(moved.adjustments.map((a) => a.kind)).toEqual(['addPoints', 'scaleToMean', 'cap']);
    expect(edits.moveAdjustment(moved, 0, -1)).toBe(moved);
    const replaced = edits.replaceAdjustment(moved, 0, { kind: 'addPoints', section: null, points: -1 });
    expect(replaced.adjustments[0]).toEqual({ kind: 'addPoints', section: null, points: -1 });
    expect(edits.removeAdjustment(replaced, 1).adjustments.map((a) => a.kind)).toEqual(['addPoints', 'cap']);
  });

  it('refuses values an adjustment cannot hold', () => {
    expect(() => edits.addAdjustment(basePlan(), { kind: 'scaleToMean', section: null, targetMean: 0 })).toThrow(/target mean must be > 0/);
    expect(() => edits.addAdjustment(basePlan(), { kind: 'cap', section: null, maxPercent: -5 })).toThrow(/cap must be > 0/);
    expect(() => edits.addAdjustment(basePlan(), { kind: 'addPoints', section: null, points: Number.POSITIVE_INFINITY })).toThrow(/needs a number/);
    expect(() => edits.removeAdjustment(basePlan(), 5)).toThrow(/No adjustment at position 6/);
  });
});

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { adjustedValueOf, applyAdjustments } from '../../../renderer/engine/grading/adjustments';
import { adjustmentArb } from '../fast/arbitraries';
import { gradeCourse } from '../../../renderer/engine/grading/gradeCourse';
import { book, category, E, plan, type Column } from './helpers';

// Additive and multiplicative curves are common practice, no source; expected values are hand arithmetic.

const mean = (xs: readonly number[]): number => xs.reduce((s, x) => s + x, 0) / xs.length;

describe('applyAdjustments', () => {
  it('add points to one section only, null stays null', () => {
    const r = applyAdjustments([70, 80, null, 60], ['A', 'B', 'A', 'A'], [{ kind: 'addPoints', section: 'A', points: 5 }]);
    expect(r.values).toEqual([75, 80, null, 65]);
    expect(r.lines[0]).toEqual([{ kind: 'adjustment', adjustment: { kind: 'addPoints', section: 'A', points: 5 }, before: 70, after: 75 }]);
    expect(r.lines[1]).toEqual([]);
    expect(r.lines[2]).toEqual([]);
  });

  it('scale to a target mean: factor = target / mean before the step (hand: 60, 80 → mean 70, ×75/70)', () => {
    const r = applyAdjustments([60, 80, 50], ['A', 'A', 'B'], [{ kind: 'scaleToMean', section: 'A', targetMean: 75 }]);
    expect(r.values[0]).toBeCloseTo((60 * 75) / 70, 12);
    expect(r.values[1]).toBeCloseTo((80 * 75) / 70, 12);
    expect(r.values[2]).toBe(50);
  });

  it('property: after scaleToMean the group mean hits the target', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 1, max: 100, noNaN: true }), { minLength: 1, maxLength: 30 }),
        fc.double({ min: 40, max: 90, noNaN: true }),
        (values, target) => {
          const r = applyAdjustments(values, values.map(() => 'A'), [{ kind: 'scaleToMean', section: null, targetMean: target }]);
          expect(mean(r.values as number[])).toBeCloseTo(target, 9);
        },
      ),
    );
  });

  it('the steps chain in order: add, then scale sees the added values, then cap', () => {
    const r = applyAdjustments([50, 70, 90], ['A', 'A', 'A'], [
      { kind: 'addPoints', section: null, points: 10 }, // 60, 80, 100 (mean 80)
      { kind: 'scaleToMean', section: null, targetMean: 88 }, // ×1.1: 66, 88, 110
      { kind: 'cap', section: null, maxPercent: 100 }, // 66, 88, 100
    ]);
    expect(r.values[0]).toBeCloseTo(66, 12);
    expect(r.values[1]).toBeCloseTo(88, 12);
    expect(r.values[2]).toBe(100);
    expect(r.lines[2]!.map((l) => l.after)).toEqual([100, expect.closeTo(110, 12), 100]);
  });

  it('section null scales the course as one group, not each section separately', () => {
    const r = applyAdjustments([40, 60, 80, 100], ['A', 'A', 'B', 'B'], [{ kind: 'scaleToMean', section: null, targetMean: 77 }]);
    expect(mean(r.values as number[])).toBeCloseTo(77, 12);
    expect(r.values[0]).toBeCloseTo(40 * (77 / 70), 12);
  });

  it('a group with no marks or mean 0 is not scaled and is reported; non-numbers are refused', () => {
    const r = applyAdjustments([0, 0, null], ['A', 'A', 'B'], [
      { kind: 'scaleToMean', section: 'A', targetMean: 70 },
      { kind: 'scaleToMean', section: 'B', targetMean: 70 },
      { kind: 'addPoints', section: null, points: Number.NaN },
    ]);
    expect(r.values).toEqual([0, 0, null]);
    expect(r.problems).toEqual([
      'Adjustment 1 (scale to mean 70 for section A) was not applied: the group has a mean of 0.',
      'Adjustment 2 (scale to mean 70 for section B) was not applied: the group has no marks.',
      'Adjustment 3 (addPoints for the whole course) was not applied: its value is not a number.',
    ]);
  });
});

describe('adjustments in gradeCourse', () => {
  const cols: Column[] = [{ id: 'x', possible: 100, categoryId: 'all' }];
  const b = book(cols, [
    { student: { id: 'a1', section: 'A' }, scores: [E(60)] },
    { student: { id: 'a2', section: 'A' }, scores: [E(70)] },
    { student: { id: 'b1', section: 'B' }, scores: [E(95)] },
  ]);
  it('section B capped, section A scaled to mean 75; lines visible, rounding after', () => {
    const p = plan(cols, [category('all', 100)], {
      rounding: { decimals: 1 },
      adjustments: [
        { kind: 'scaleToMean', section: 'A', targetMean: 75 },
        { kind: 'cap', section: 'B', maxPercent: 90 },
      ],
    });
    const [a1, a2, b1] = gradeCourse(b, p).students;
    // A: mean 65, factor 75/65: 60 → 69.2307…, 70 → 80.7692…
    expect(a1!.adjusted).toBeCloseTo((60 * 75) / 65, 12);
    expect(a1!.final).toBe(69.2);
    expect(a2!.final).toBe(80.8);
    expect(b1!.final).toBe(90);
    expect(a1!.lines.filter((l) => l.kind === 'adjustment')).toHaveLength(1);
    expect(b1!.lines.filter((l) => l.kind === 'adjustment')).toEqual([
      { kind: 'adjustment', adjustment: { kind: 'cap', section: 'B', maxPercent: 90 }, before: 95, after: 90 },
    ]);
    expect(mean([a1!.adjusted!, a2!.adjusted!])).toBeCloseTo(75, 12);
  });
});

describe('adjustedValueOf equals applyAdjustments for one student', () => {
  it('on random marks, sections and adjustment lists (non-finite parameters and empty groups included)', () => {
    const marks = fc.array(fc.record({ value: fc.option(fc.double({ min: -10, max: 120, noNaN: true }), { freq: 5 }), section: fc.constantFrom('A', 'B', 'A2') }), { minLength: 1, maxLength: 12 });
    fc.assert(
      fc.property(marks, fc.array(adjustmentArb, { maxLength: 4 }), fc.nat(), (rows, adjustments, pick) => {
        const values = rows.map((r) => r.value);
        const sections = rows.map((r) => r.section);
        const i = pick % rows.length;
        expect(adjustedValueOf(values, sections, adjustments, i)).toBe(applyAdjustments(values, sections, adjustments).values[i] ?? null);
      }),
      { numRuns: 3000 },
    );
  });
});

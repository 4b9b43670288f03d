import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  dropCount,
  dropForTotalPoints,
  dropLowestPercents,
  type DropCandidate,
} from '../../../renderer/engine/grading/dropLowest';

const ratio = (items: readonly DropCandidate[], kept: readonly number[]): number =>
  kept.reduce((s, i) => s + items[i]!.earned, 0) / kept.reduce((s, i) => s + items[i]!.possible, 0);

/** Oracle: every way of keeping k of the items (brute force; tests only). */
function* subsets(n: number, k: number, start = 0, acc: number[] = []): Generator<number[]> {
  if (acc.length === k) {
    yield acc.slice();
    return;
  }
  for (let i = start; i <= n - (k - acc.length); i++) {
    acc.push(i);
    yield* subsets(n, k, i + 1, acc);
    acc.pop();
  }
}

describe('dropForTotalPoints', () => {
  it('Kane & Kane (2006) counter-example: dropping the lowest percent is not optimal', () => {
    // Kane, D. M. & Kane, J. M. (2006) "Dropping Lowest Grades", Mathematics Magazine 79(3):181–189
    // [from memory]; the numbers are the hand-derivable example in REFERENCES.md:
    // items 20/100, 0/2, 10/10, drop one. Dropping 0/2 (lowest percent) → 30/110 = 27.27 %;
    // dropping 20/100 → 10/12 = 83.33 %; dropping 10/10 → 20/102 = 19.6 %.
    const items = [
      { earned: 20, possible: 100 },
      { earned: 0, possible: 2 },
      { earned: 10, possible: 10 },
    ];
    const choice = dropForTotalPoints(items, 1);
    expect(choice.dropped).toEqual([0]);
    expect(choice.kept).toEqual([1, 2]);
    expect(ratio(items, choice.kept)).toBeCloseTo(10 / 12, 12);
    // the naive rule would have dropped item 1
    expect(dropLowestPercents(items, 1).dropped).toEqual([1]);
  });

  it('equal possible: optimal drop = lowest percents (hand arithmetic: 10-point quizzes 4, 9, 7, 6 drop 2 → keep 9, 7)', () => {
    const items = [4, 9, 7, 6].map((earned) => ({ earned, possible: 10 }));
    expect(dropForTotalPoints(items, 2).dropped).toEqual([0, 3]);
  });

  it('ties: the earliest of equal items is dropped', () => {
    const items = [5, 5, 5].map((earned) => ({ earned, possible: 10 }));
    expect(dropForTotalPoints(items, 1).dropped).toEqual([0]);
    expect(dropLowestPercents(items, 2).dropped).toEqual([0, 1]);
    // 1/2 and 5/10 are the same percent: still the earlier one goes
    expect(dropLowestPercents([{ earned: 9, possible: 10 }, { earned: 5, possible: 10 }, { earned: 1, possible: 2 }], 1).dropped).toEqual([1]);
  });

  it('float noise does not decide ties: 0.1 + 0.2 points vs 0.3 points', () => {
    const items = [
      { earned: 0.1 + 0.2, possible: 1 },
      { earned: 0.3, possible: 1 },
      { earned: 1, possible: 1 },
    ];
    expect(dropForTotalPoints(items, 1).dropped).toEqual([0]);
    expect(dropLowestPercents(items, 1).dropped).toEqual([0]);
  });

  it('never drops every item: at least one is kept', () => {
    const items = [{ earned: 1, possible: 10 }, { earned: 2, possible: 10 }];
    expect(dropForTotalPoints(items, 5).kept).toEqual([1]);
    expect(dropLowestPercents(items, 2).kept).toEqual([1]);
    expect(dropForTotalPoints([{ earned: 1, possible: 10 }], 1).kept).toEqual([0]);
    expect(dropForTotalPoints([], 1)).toEqual({ kept: [], dropped: [] });
    expect(dropCount(4, 2)).toBe(2);
    expect(dropCount(4, 9)).toBe(3);
    expect(dropCount(4, 1.7)).toBe(1);
    expect(dropCount(4, -1)).toBe(0);
    expect(dropCount(4, Number.NaN)).toBe(0);
  });

  const cases = fc
    .array(
      fc.record({
        possible: fc.integer({ min: 1, max: 100 }),
        frac: fc.integer({ min: 0, max: 100 }),
      }),
      { minLength: 1, maxLength: 8 },
    )
    .map((xs) => xs.map(({ possible, frac }) => ({ possible, earned: (possible * frac) / 100 })));

  it('property: optimal drop is never worse than any other choice of N items (brute-force oracle)', () => {
    fc.assert(
      fc.property(cases, fc.integer({ min: 0, max: 7 }), (items, requested) => {
        const choice = dropForTotalPoints(items, requested);
        const n = dropCount(items.length, requested);
        expect(choice.dropped.length).toBe(n);
        expect(choice.kept.length + choice.dropped.length).toBe(items.length);
        const got = ratio(items, choice.kept);
        let best = -Infinity;
        for (const kept of subsets(items.length, items.length - n)) best = Math.max(best, ratio(items, kept));
        expect(got).toBeGreaterThanOrEqual(best - 1e-12);
      }),
      { numRuns: 400 },
    );
  });

  it('property: equal-items drop maximises the mean of percents (brute-force oracle)', () => {
    fc.assert(
      fc.property(cases, fc.integer({ min: 0, max: 7 }), (items, requested) => {
        const mean = (kept: readonly number[]): number =>
          kept.reduce((s, i) => s + items[i]!.earned / items[i]!.possible, 0) / kept.length;
        const choice = dropLowestPercents(items, requested);
        const n = dropCount(items.length, requested);
        let best = -Infinity;
        for (const kept of subsets(items.length, items.length - n)) best = Math.max(best, mean(kept));
        expect(mean(choice.kept)).toBeGreaterThanOrEqual(best - 1e-12);
      }),
      { numRuns: 300 },
    );
  });

  it('property: result does not depend on the order of the items (up to ties)', () => {
    fc.assert(
      fc.property(cases, fc.integer({ min: 1, max: 3 }), (items, requested) => {
        const reversed = items.slice().reverse();
        const a = ratio(items, dropForTotalPoints(items, requested).kept);
        const b = ratio(reversed, dropForTotalPoints(reversed, requested).kept);
        expect(a).toBeCloseTo(b, 12);
      }),
    );
  });
});

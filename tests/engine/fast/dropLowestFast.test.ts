/**
 * The typed-array drop must choose exactly the items grading/dropLowest.ts chooses (whose optimality
 * is checked there against Kane & Kane 2006), or decline so the caller uses the plain function.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { dropForTotalPoints, dropLowestPercents } from '../../../renderer/engine/grading/dropLowest';
import { dropForTotalPointsFast, dropLowestPercentsFast, dropScratch } from '../../../renderer/engine/fast';

const itemArb = fc.oneof(
  fc.tuple(fc.integer({ min: 0, max: 200 }), fc.integer({ min: 1, max: 100 })).map(([e, p]) => ({ earned: e / 2, possible: p })),
  fc.tuple(fc.double({ min: 0, max: 120, noNaN: true }), fc.double({ min: 0.01, max: 100, noNaN: true })).map(([e, p]) => ({ earned: e, possible: p })),
  fc.constant({ earned: 0, possible: 10 }),
  fc.constant({ earned: 5, possible: 10 }),
);

// Few distinct values, so that equal percents and equal Dinkelbach keys (ties) are common.
const tiedItemArb = fc
  .tuple(fc.constantFrom(0, 2.5, 5, 7.5, 10, 20), fc.constantFrom(5, 10, 20))
  .map(([e, p]) => ({ earned: e, possible: p }));

function check(fast: typeof dropForTotalPointsFast, plain: typeof dropForTotalPoints, items = itemArb) {
  fc.assert(
    fc.property(fc.array(items, { minLength: 1, maxLength: 12 }), fc.oneof(fc.integer({ min: 0, max: 13 }), fc.constant(1.5)), (items, requested) => {
      const n = items.length;
      const e = Float64Array.from(items, (i) => i.earned);
      const p = Float64Array.from(items, (i) => i.possible);
      const s = dropScratch(n);
      const decided = fast(e, p, n, requested, s);
      const expected = plain(items, requested).dropped;
      if (decided) expect([...s.dropped.subarray(0, n)].flatMap((d, i) => (d === 1 ? [i] : []))).toStrictEqual(expected);
      return true;
    }),
    { numRuns: 5000 },
  );
}

describe('fast drop lowest equals the plain choice', () => {
  it('total points (Dinkelbach)', () => check(dropForTotalPointsFast, dropForTotalPoints));
  it('equal items', () => check(dropLowestPercentsFast, dropLowestPercents));
  it('total points, with many ties', () => check(dropForTotalPointsFast, dropForTotalPoints, tiedItemArb));
  it('equal items, with many ties', () => check(dropLowestPercentsFast, dropLowestPercents, tiedItemArb));

  it('decides half-point marks itself, and declines sums too large for exact products', () => {
    const s = dropScratch(3);
    // Kane & Kane (2006) [from memory]: 20/100, 0/2, 10/10, drop one → drop 20/100 (index 0).
    expect(dropForTotalPointsFast(Float64Array.of(20, 0, 10), Float64Array.of(100, 2, 10), 3, 1, s)).toBe(true);
    expect([...s.dropped]).toStrictEqual([1, 0, 0]);
    expect(dropForTotalPointsFast(Float64Array.of(1e9, 0.1234567, 3), Float64Array.of(1e9, 1, 7), 3, 1, s)).toBe(false);
  });
});

/**
 * sortFinals must give exactly Float64Array.prototype.sort's order (numeric comparison; ECMAScript
 * 2024 §23.2.3.29, the section number from memory) — on values on its rounding grid (the counting
 * sort's case), off it (where it must detect the grid does not hold and fall back), and on wide
 * ranges.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { roundHalfUp } from '../../../renderer/engine/grading/rounding';
import { sortFinals } from '../../../renderer/engine/fast/sortFinals';

const native = (xs: Float64Array): number[] => [...xs.slice().sort()];

describe('sortFinals equals the native numeric sort', () => {
  it('on rounded marks (the grid case), for 0 to 4 decimals', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 4 }), fc.array(fc.double({ min: 0, max: 130, noNaN: true }), { minLength: 0, maxLength: 600, size: 'max' }), (d, xs) => {
        const values = Float64Array.from(xs, (x) => roundHalfUp(x, d));
        const before = [...values];
        expect([...sortFinals(values, d)]).toStrictEqual(native(values));
        expect([...values]).toStrictEqual(before); // input untouched
      }),
      { numRuns: 400 },
    );
  });

  it('on values off the grid (told the wrong number of decimals)', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 100, noNaN: true }), { minLength: 64, maxLength: 400 }), fc.integer({ min: 0, max: 2 }), (xs, d) => {
        const values = Float64Array.from(xs);
        expect([...sortFinals(values, d)]).toStrictEqual(native(values));
      }),
      { numRuns: 300 },
    );
  });

  it('on few distinct values with many repeats, wide ranges, and huge or infinite values', () => {
    const repeats = Float64Array.from({ length: 1000 }, (_, i) => [71.5, 0, 100, 64.3][i % 4]!);
    expect([...sortFinals(repeats, 1)]).toStrictEqual(native(repeats));
    const wide = Float64Array.from({ length: 200 }, (_, i) => (i % 2 === 0 ? i * 1e6 : 1e-3 * i));
    expect([...sortFinals(wide, 3)]).toStrictEqual(native(wide));
    const inf = Float64Array.from({ length: 100 }, (_, i) => (i === 50 ? Infinity : i / 10));
    expect([...sortFinals(inf, 1)]).toStrictEqual(native(inf));
    // Two doubles in one bucket in the wrong order: caught by the final check.
    const close = Float64Array.from({ length: 100 }, (_, i) => (i % 2 === 0 ? 50.0000001 : 50));
    expect([...sortFinals(close, 1)]).toStrictEqual(native(close));
  });
});

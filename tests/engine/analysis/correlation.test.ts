/**
 * pearson(): Anscombe's quartet, hand-derived cases, jstat `corrcoeff` as an independent library.
 */
import jStatModule from 'jstat';
import { describe, expect, it } from 'vitest';
import { pearson } from '../../../renderer/engine/analysis/correlation';
import type { Defined } from '../../../renderer/engine/defined';

// jstat ships no types and the project's declaration lists only what the engine uses.
const jStat = jStatModule as unknown as { corrcoeff(a: number[], b: number[]): number };

function value(d: Defined<number>): number {
  if (!d.defined) throw new Error(`expected a defined value, got: ${d.reason}`);
  return d.value;
}

describe('pearson', () => {
  // Anscombe, F. J. (1973) "Graphs in statistical analysis", The American Statistician 27(1):17–21:
  // all four data sets have correlation 0.816 (published to 3 decimals). The data values are
  // typed from memory; a slip in any of them would move r off 0.816 and fail the check.
  const x = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5];
  const quartet: [number[], number[]][] = [
    [x, [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68]],
    [x, [9.14, 8.14, 8.74, 8.77, 9.26, 8.1, 6.13, 3.1, 9.13, 7.26, 4.74]],
    [x, [7.46, 6.77, 12.74, 7.11, 7.81, 8.84, 6.08, 5.39, 8.15, 6.42, 5.73]],
    [[8, 8, 8, 8, 8, 8, 8, 19, 8, 8, 8], [6.58, 5.76, 7.71, 8.84, 8.47, 7.04, 5.25, 12.5, 5.56, 7.91, 6.89]],
  ];
  quartet.forEach(([a, b], i) => {
    it(`Anscombe (1973) set ${i + 1}: r = 0.816 to 3 decimals, equal to jstat corrcoeff`, () => {
      const r = value(pearson(a, b));
      // "0.816" as printed: set 4 gives 0.8165…, so allow the last printed digit ±1.
      expect(Math.abs(r - 0.816)).toBeLessThan(0.001);
      // jstat 1.9.6 corrcoeff: independent implementation (covariance / (σx σy)).
      expect(r).toBeCloseTo(jStat.corrcoeff(a, b), 12);
    });
  });

  it('hand-derived: x = 1,2,3 and y = 1,3,2 give r = 1/2', () => {
    // x̄ = ȳ = 2; Σdx·dy = (−1)(−1) + 0·1 + 1·0 = 1; Σdx² = Σdy² = 2; r = 1/√(2·2) = 0.5.
    expect(value(pearson([1, 2, 3], [1, 3, 2]))).toBeCloseTo(0.5, 15);
  });

  it('perfect linear relations give ±1 and never beyond (clamped against rounding)', () => {
    const up = value(pearson([1, 2, 3, 4, 5], [0.1, 0.2, 0.3, 0.4, 0.5]));
    const down = value(pearson([1, 2, 3, 4, 5], [9, 7, 5, 3, 1]));
    expect(up).toBeCloseTo(1, 14);
    expect(up).toBeLessThanOrEqual(1);
    expect(down).toBeCloseTo(-1, 14);
    expect(down).toBeGreaterThanOrEqual(-1);
  });

  it('is not defined, with a reason, for < 3 pairs or no spread — never NaN', () => {
    const two = pearson([1, 2], [3, 4]);
    expect(two.defined).toBe(false);
    if (!two.defined) expect(two.reason).toMatch(/2 pairs/);
    const flat = pearson([5, 5, 5, 5], [1, 2, 3, 4]);
    expect(flat.defined).toBe(false);
    if (!flat.defined) expect(flat.reason).toMatch(/item has no spread/);
    const flatY = pearson([1, 2, 3, 4], [7, 7, 7, 7]);
    expect(flatY.defined).toBe(false);
  });

  it('refuses arrays of different length', () => {
    expect(() => pearson([1, 2, 3], [1, 2])).toThrow(/3 x values but 2 y values/);
  });
});

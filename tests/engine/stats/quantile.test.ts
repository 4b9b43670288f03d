/**
 * Hyndman & Fan (1996) "Sample quantiles in statistical packages", Am. Stat. 50(4):361–365 —
 * all nine definitions. Expected values: the worked tables in REFERENCES.md (hand arithmetic from
 * the definitions, [src]), cross-checked against d3-array 3.2.5 `quantile` (type 7) and jstat
 * 1.9.6 `quantiles(arr, ps, alphap, betap)` (types 4–9, scipy's plotting-position parameters).
 */
import { quantile as d3Quantile } from 'd3-array';
import fc from 'fast-check';
import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { QUANTILE_METHODS, QUANTILE_TYPES, quantile, quantileSorted, type QuantileType } from '../../../renderer/engine/stats';

const oneToTen = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
const elevens = [6, 7, 15, 36, 39, 40, 41, 42, 43, 47, 49];

// [Q1, median, Q3] per type, REFERENCES.md tables (exact fractions written as fractions).
const table1to10: Record<QuantileType, [number, number, number]> = {
  1: [3, 5, 8],
  2: [3, 5.5, 8],
  3: [2, 5, 8],
  4: [2.5, 5, 7.5],
  5: [3, 5.5, 8],
  6: [2.75, 5.5, 8.25],
  7: [3.25, 5.5, 7.75],
  8: [35 / 12, 5.5, 97 / 12],
  9: [2.9375, 5.5, 8.0625],
};
const table11: Record<QuantileType, [number, number, number]> = {
  1: [15, 40, 43],
  2: [15, 40, 43],
  3: [15, 40, 42],
  4: [13, 39.5, 42.25],
  5: [20.25, 40, 42.75],
  6: [15, 40, 43],
  7: [25.5, 40, 42.5],
  8: [18.5, 40, 257 / 6],
  9: [18.9375, 40, 42.8125],
};

// scipy/jstat (alphap, betap) for H&F types 4–9 (Hyndman & Fan 1996, table; scipy docs).
const jstatParams: Partial<Record<QuantileType, [number, number]>> = {
  4: [0, 1],
  5: [0.5, 0.5],
  6: [0, 0],
  7: [1, 1],
  8: [1 / 3, 1 / 3],
  9: [3 / 8, 3 / 8],
};

const ps = [0.25, 0.5, 0.75] as const;

describe('quantileSorted: Hyndman & Fan worked tables (REFERENCES.md)', () => {
  for (const [name, data, table] of [
    ['x = 1…10', oneToTen, table1to10],
    ['x = 6, 7, 15, 36, …, 49', elevens, table11],
  ] as const) {
    for (const type of QUANTILE_TYPES) {
      it(`${name}, type ${type}: Q1, median, Q3`, () => {
        const expected = table[type];
        ps.forEach((p, i) => {
          // 1e-12 absolute: the fractions 35/12 etc. are not exact in binary64.
          expect(quantileSorted(data, p, type)).toBeCloseTo(expected[i] as number, 12);
        });
      });
    }
  }
});

describe('quantileSorted: cross-checks with independent libraries', () => {
  it('type 7 equals d3-array quantile on both data sets at many p', () => {
    for (const data of [oneToTen, elevens]) {
      for (let k = 0; k <= 100; k++) {
        const p = k / 100;
        expect(quantileSorted(data, p, 7)).toBeCloseTo(d3Quantile(data, p) as number, 12);
      }
    }
  });

  it('types 4–9 equal jstat quantiles(arr, ps, alphap, betap) at interior p', () => {
    for (const data of [oneToTen, elevens]) {
      for (const [typeText, ab] of Object.entries(jstatParams)) {
        const type = Number(typeText) as QuantileType;
        const [a, b] = ab as [number, number];
        // jstat clips the position to [1, n − 1]; compare where both formulas are unclipped.
        const grid = [0.2, 0.25, 0.3, 0.4, 0.5, 0.6, 0.7, 0.75, 0.8];
        const theirs = jStat.quantiles(data, grid, a, b);
        grid.forEach((p, i) => expect(quantileSorted(data, p, type)).toBeCloseTo(theirs[i] as number, 12));
      }
    }
  });

  it('property: type 7 equals d3-array on random finite arrays (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 60 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (xs, p) => {
          const sorted = [...xs].sort((a, b) => a - b);
          const ours = quantileSorted(sorted, p, 7);
          const theirs = d3Quantile(sorted, p) as number;
          const scale = Math.max(1, Math.abs(sorted[0] as number), Math.abs(sorted[sorted.length - 1] as number));
          expect(Math.abs(ours - theirs)).toBeLessThanOrEqual(1e-12 * scale);
        },
      ),
    );
  });

  it('property: types 4–9 equal jstat quantiles on random arrays at any p (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 10000 }).map((v) => v / 100), { minLength: 2, maxLength: 50 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.constantFrom<QuantileType>(4, 5, 6, 7, 8, 9),
        (xs, p, type) => {
          const sorted = [...xs].sort((a, b) => a - b);
          const [a, b] = jstatParams[type] as [number, number];
          const theirs = jStat.quantiles(sorted, [p], a, b)[0] as number;
          expect(Math.abs(quantileSorted(sorted, p, type) - theirs)).toBeLessThanOrEqual(1e-9);
        },
      ),
    );
  });

  it('property: every type is non-decreasing in p and stays within [min, max]', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 1, maxLength: 40 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (xs, p1, p2) => {
          const sorted = [...xs].sort((a, b) => a - b);
          const [lo, hi] = p1 <= p2 ? [p1, p2] : [p2, p1];
          for (const type of QUANTILE_TYPES) {
            const q1 = quantileSorted(sorted, lo, type);
            const q2 = quantileSorted(sorted, hi, type);
            expect(q1).toBeLessThanOrEqual(q2);
            expect(q1).toBeGreaterThanOrEqual(sorted[0] as number);
            expect(q2).toBeLessThanOrEqual(sorted[sorted.length - 1] as number);
          }
        },
      ),
    );
  });
});

describe('quantileSorted: definition details', () => {
  it('p = 0 gives the minimum and p = 1 the maximum for every type (order statistics clamped)', () => {
    for (const type of QUANTILE_TYPES) {
      expect(quantileSorted(elevens, 0, type)).toBe(6);
      expect(quantileSorted(elevens, 1, type)).toBe(49);
    }
  });

  it('n·p that is an integer in exact arithmetic is treated as one (25 × 0.28, 50 × 0.58)', () => {
    // In binary64 25 * 0.28 = 7.000000000000001 and 50 * 0.58 = 28.999999999999996.
    expect(25 * 0.28).not.toBe(7);
    expect(50 * 0.58).not.toBe(29);
    const upTo = (n: number): number[] => Array.from({ length: n }, (_, i) => i + 1);
    // Type 1: np = 7 ⇒ j = 7, g = 0 ⇒ γ = 0 ⇒ x₍₇₎ = 7 (H&F 1996, definition 1); unsnapped: x₍₈₎.
    expect(quantileSorted(upTo(25), 0.28, 1)).toBe(7);
    // Type 2: np = 29 ⇒ g = 0 ⇒ ½(x₍₂₉₎ + x₍₃₀₎) = 29.5; unsnapped: j = 28, γ = 1 ⇒ 29.
    expect(quantileSorted(upTo(50), 0.58, 2)).toBe(29.5);
    // Type 3: np − ½ = 6.5 is not an integer ⇒ γ = 1 ⇒ x₍₇₎.
    expect(quantileSorted(upTo(25), 0.28, 3)).toBe(7);
  });

  it('type 3 rounds to the even order statistic when g = 0 (H&F definition 3)', () => {
    // n = 10, p = 0.25: np − ½ = 2 ⇒ j = 2 (even) ⇒ x₍₂₎; p = 0.75: j = 7 (odd) ⇒ x₍₈₎.
    expect(quantileSorted(oneToTen, 0.25, 3)).toBe(2);
    expect(quantileSorted(oneToTen, 0.75, 3)).toBe(8);
  });

  it('a single value is every quantile', () => {
    for (const type of QUANTILE_TYPES) expect(quantileSorted([42], 0.3, type)).toBe(42);
  });

  it('rejects bad arguments with the function name', () => {
    expect(() => quantileSorted([], 0.5)).toThrow(/quantileSorted/);
    expect(() => quantileSorted([1, 2], 1.5)).toThrow(/quantileSorted: p is 1.5/);
    expect(() => quantileSorted([1, 2], Number.NaN)).toThrow(/quantileSorted/);
    expect(() => quantileSorted([1, 2], 0.5, 10 as QuantileType)).toThrow(/quantileSorted: type/);
  });

  it('quantile() sorts a copy, is not defined for n = 0, and rejects NaN', () => {
    const data = [49, 6, 43, 15, 7, 36, 39, 40, 41, 42, 47];
    const copy = [...data];
    expect(quantile(data, 0.75, 8)).toEqual({ defined: true, value: quantileSorted(elevens, 0.75, 8) });
    expect(data).toEqual(copy);
    expect(quantile([], 0.5)).toEqual({ defined: false, reason: 'no values (n = 0)' });
    expect(() => quantile([1, Number.NaN], 0.5)).toThrow(/quantile: value at index 1 is NaN/);
  });

  it('names every method; type 7 is the (k−1)/(n−1) rule', () => {
    for (const type of QUANTILE_TYPES) expect(QUANTILE_METHODS[type].name).toContain(`type ${type}`);
    expect(QUANTILE_METHODS[7].name).toBe('Hyndman–Fan type 7 (linear, (k−1)/(n−1))');
  });
});

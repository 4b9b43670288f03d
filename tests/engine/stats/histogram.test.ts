/**
 * Histogram bin rules — REFERENCES.md "Histogram bin rules":
 * Sturges (1926) k = ⌈log₂ n + 1⌉; Scott (1979) h = 3.49·s·n^(−1/3); Freedman & Diaconis (1981)
 * h = 2·IQR·n^(−1/3). s and IQR for the expected widths come from independent libraries
 * (simple-statistics 7.12.1 sampleStandardDeviation, d3-array 3.2.5 quantile).
 */
import { quantile as d3Quantile } from 'd3-array';
import fc from 'fast-check';
import { sampleStandardDeviation } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import type { Defined } from '../../../renderer/engine/defined';
import { histogram, sturgesBinCount, type BinRule, type Histogram } from '../../../renderer/engine/stats';

function value<T>(d: Defined<T>): T {
  if (!d.defined) throw new Error(`expected a defined value, got: ${d.reason}`);
  return d.value;
}

/** Structural checks every histogram must pass: contiguous bins, min…max covered, counts = n. */
function checkCoverage(h: Histogram, xs: readonly number[]): void {
  const bins = h.bins;
  const total = bins.reduce((s, b) => s + b.count, 0);
  expect(total).toBe(xs.length);
  const first = bins[0];
  const last = bins[bins.length - 1];
  if (first === undefined || last === undefined) throw new Error('no bins');
  expect(first.lower).toBeLessThanOrEqual(Math.min(...xs));
  expect(last.upper).toBeGreaterThanOrEqual(Math.max(...xs));
  for (let i = 1; i < bins.length; i++) expect((bins[i] as { lower: number }).lower).toBe((bins[i - 1] as { upper: number }).upper);
  // Each value is counted in the bin whose [lower, upper) — or closed last bin — contains it.
  bins.forEach((b, i) => {
    const isLast = i === bins.length - 1;
    const inside = xs.filter((x) => x >= b.lower && (x < b.upper || (isLast && x <= b.upper))).length;
    expect(b.count).toBe(inside);
  });
}

const marks = [47, 60, 62, 64, 65, 67, 69, 72, 73, 80, 6, 7, 15, 36, 39, 40, 41, 42, 43, 47, 49];

describe('Sturges (1926): k = ⌈log₂ n + 1⌉', () => {
  it('n = 100 → 8, n = 200 → 9, n = 218 → 9 (REFERENCES.md)', () => {
    expect(sturgesBinCount(100)).toBe(8);
    expect(sturgesBinCount(200)).toBe(9);
    expect(sturgesBinCount(218)).toBe(9);
    // Power of two: log₂ 128 = 7 exactly ⇒ 8 classes.
    expect(sturgesBinCount(128)).toBe(8);
  });

  it('histogram of 100 values has 8 equal bins from min to max', () => {
    const xs = Array.from({ length: 100 }, (_, i) => (i * 37) % 101);
    const h = value(histogram(xs, { kind: 'sturges' }));
    expect(h.bins).toHaveLength(8);
    expect(h.bins[0]?.lower).toBe(Math.min(...xs));
    expect(h.bins[7]?.upper).toBe(Math.max(...xs));
    expect(h.binWidth).toBeCloseTo((Math.max(...xs) - Math.min(...xs)) / 8, 12);
    checkCoverage(h, xs);
  });
});

describe('Scott (1979) and Freedman–Diaconis (1981) widths', () => {
  it('Scott: h = 3.49·s·n^(−1/3) with the sample SD', () => {
    const h = value(histogram(marks, { kind: 'scott' }));
    const expected = 3.49 * sampleStandardDeviation(marks) * Math.pow(marks.length, -1 / 3);
    expect(h.binWidth).toBeCloseTo(expected, 10);
    expect(h.bins).toHaveLength(Math.ceil((80 - 6) / expected));
    checkCoverage(h, marks);
  });

  it('Freedman–Diaconis: h = 2·IQR·n^(−1/3) with the type 7 IQR', () => {
    const h = value(histogram(marks, { kind: 'freedmanDiaconis' }));
    const iqr = (d3Quantile(marks, 0.75) as number) - (d3Quantile(marks, 0.25) as number);
    const expected = 2 * iqr * Math.pow(marks.length, -1 / 3);
    expect(h.binWidth).toBeCloseTo(expected, 10);
    checkCoverage(h, marks);
  });
});

describe('fixed width, half-open bins with the last closed', () => {
  it('an interior edge value goes to the upper bin; the maximum on the last edge stays in the last bin', () => {
    const h = value(histogram([0, 5, 10], { kind: 'fixed', width: 5 }));
    expect(h.bins).toEqual([
      { lower: 0, upper: 5, count: 1 },
      { lower: 5, upper: 10, count: 2 },
    ]);
    const pct = value(histogram([0, 90, 95, 100], { kind: 'fixed', width: 10 }));
    expect(pct.bins).toHaveLength(10);
    expect(pct.bins[9]).toEqual({ lower: 90, upper: 100, count: 3 });
  });

  it('edges are aligned to the origin', () => {
    const h = value(histogram([12, 17, 23], { kind: 'fixed', width: 5, origin: 2.5 }));
    expect(h.bins.map((b) => b.lower)).toEqual([7.5, 12.5, 17.5, 22.5]);
    expect(h.bins.map((b) => b.count)).toEqual([1, 1, 0, 1]);
  });

  it('a value just below an edge stays inside the first bin (division underflow, found by fast-check)', () => {
    // −5e−324 / 7 underflows to −0, so ⌊(min − origin)/h⌋ alone would put the first edge above min.
    const h = value(histogram([-5e-324], { kind: 'fixed', width: 7 }));
    expect(h.bins).toEqual([{ lower: -7, upper: 0, count: 1 }]);
  });

  it('all values equal: one bin of the given width', () => {
    expect(value(histogram([80, 80], { kind: 'fixed', width: 10 })).bins).toEqual([{ lower: 80, upper: 90, count: 2 }]);
  });
});

describe('degenerate cases: not defined with a reason', () => {
  it('n = 0, no spread, IQR 0, width ≤ 0', () => {
    expect(histogram([], { kind: 'sturges' })).toEqual({ defined: false, reason: 'no values (n = 0)' });
    for (const kind of ['sturges', 'scott', 'freedmanDiaconis'] as const) {
      const h = histogram([70, 70, 70], { kind });
      expect(h.defined).toBe(false);
      if (!h.defined) expect(h.reason).toMatch(/all 3 values equal 70/);
    }
    const fd = histogram([1, 1, 1, 1, 5], { kind: 'freedmanDiaconis' });
    expect(fd.defined).toBe(false);
    if (!fd.defined) expect(fd.reason).toMatch(/IQR is 0/);
    expect(histogram([1, 2], { kind: 'fixed', width: 0 }).defined).toBe(false);
    expect(histogram([0, 1e9], { kind: 'fixed', width: 1 }).defined).toBe(false);
  });

  it('NaN input or width throws, naming the function', () => {
    expect(() => histogram([1, Number.NaN], { kind: 'sturges' })).toThrow(/histogram: value at index 1/);
    expect(() => histogram([1, 2], { kind: 'fixed', width: Number.NaN })).toThrow(/histogram: bin width/);
  });
});

describe('property (fast-check): every rule covers the data and counts sum to n', () => {
  it('random marks, all rules', () => {
    const rules: BinRule[] = [{ kind: 'sturges' }, { kind: 'scott' }, { kind: 'freedmanDiaconis' }, { kind: 'fixed', width: 7 }];
    fc.assert(
      fc.property(fc.array(fc.double({ min: -50, max: 150, noNaN: true }), { minLength: 1, maxLength: 200 }), (xs) => {
        for (const rule of rules) {
          const h = histogram(xs, rule);
          if (h.defined) checkCoverage(h.value, xs);
          else expect(h.reason.length).toBeGreaterThan(0);
        }
      }),
    );
  });
});

describe('subnormal spreads (found by the property above)', () => {
  it('[7.4e-323, 7e-323]: never throws; each rule is defined with full coverage or not defined with a reason', () => {
    const xs = [7.4e-323, 7e-323];
    for (const rule of [{ kind: 'sturges' }, { kind: 'scott' }, { kind: 'freedmanDiaconis' }, { kind: 'fixed', width: 7 }] as BinRule[]) {
      const h = histogram(xs, rule);
      if (h.defined) checkCoverage(h.value, xs);
      else expect(h.reason).toMatch(/too close together|IQR|spread/);
    }
    // Sturges' width (range / 2 ≈ 2e-324) underflows to a value that cannot step from the minimum.
    const sturges = histogram(xs, { kind: 'sturges' });
    expect(sturges.defined).toBe(false);
  });
});

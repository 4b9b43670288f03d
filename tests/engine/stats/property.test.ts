/**
 * Property test (fast-check 4): describe() agrees with independent libraries on random finite
 * arrays — simple-statistics 7.12.1 (mean, variance, sampleVariance, min, max, median, modes via
 * its own counting) and d3-array 3.2.5 (quantile, type 7).
 */
import { quantile as d3Quantile } from 'd3-array';
import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { expect, it } from 'vitest';
import type { Defined } from '../../../renderer/engine/defined';
import { describe } from '../../../renderer/engine/stats';

function value<T>(d: Defined<T>): T {
  if (!d.defined) throw new Error(`expected a defined value, got: ${d.reason}`);
  return d.value;
}

// Marks-like magnitudes; integers sometimes so that ties and modes occur.
const mark = fc.oneof(fc.double({ min: -1000, max: 1000, noNaN: true }), fc.integer({ min: 0, max: 20 }));

it('describe() equals simple-statistics and d3-array within tolerance', () => {
  fc.assert(
    fc.property(fc.array(mark, { minLength: 2, maxLength: 80 }), (xs) => {
      const s = describe(xs);
      const scale = Math.max(1, ...xs.map(Math.abs));
      const close = (a: number, b: number, tol: number): void => {
        expect(Math.abs(a - b)).toBeLessThanOrEqual(tol);
      };
      close(value(s.mean), ss.mean(xs), 1e-12 * scale);
      close(value(s.sampleVariance), ss.sampleVariance(xs), 1e-10 * scale * scale);
      close(value(s.populationVariance), ss.variance(xs), 1e-10 * scale * scale);
      expect(value(s.min)).toBe(ss.min(xs));
      expect(value(s.max)).toBe(ss.max(xs));
      close(value(s.median), ss.median(xs), 1e-12 * scale);
      close(value(s.q1), d3Quantile(xs, 0.25) as number, 1e-12 * scale);
      close(value(s.q3), d3Quantile(xs, 0.75) as number, 1e-12 * scale);
      // Outliers and whiskers are consistent with the fences (Tukey 1977 rule).
      const lf = value(s.lowerFence);
      const uf = value(s.upperFence);
      const outside = xs.filter((x) => x < lf || x > uf).length;
      expect(s.outliers).toHaveLength(outside);
      if (outside < xs.length) {
        expect(value(s.whiskerLow)).toBe(Math.min(...xs.filter((x) => x >= lf)));
        expect(value(s.whiskerHigh)).toBe(Math.max(...xs.filter((x) => x <= uf)));
      }
      if (s.modes.defined) {
        // Every returned mode is a most-frequent value (simple-statistics `mode` returns one of them).
        const count = (v: number): number => xs.filter((x) => x === v).length;
        const best = count(ss.mode(xs));
        for (const m of s.modes.value) expect(count(m)).toBe(best);
      } else {
        expect(new Set(xs).size).toBe(xs.length);
      }
    }),
  );
});

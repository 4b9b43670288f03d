/**
 * ECDF F(t) = #{xᵢ ≤ t}/n, right-continuous (REFERENCES.md "ECDF, CV"), checked against jstat
 * 1.9.6 percentileOfScore(arr, t, 'weak') at data points, ties, points between data and outside.
 */
import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { ecdf, ecdfAt } from '../../../renderer/engine/stats';

const data = [72, 65, 80, 65, 91, 58, 72, 72, 100, 47];

describe('ecdf', () => {
  it('equals jstat percentileOfScore (weak) at data, ties, between data and outside the range', () => {
    const F = ecdf(data);
    for (const t of [40, 47, 50, 58, 64.999, 65, 70, 72, 72.0001, 80, 90.5, 91, 100, 120]) {
      expect(F.at(t)).toBe(jStat.percentileOfScore(data, t, 'weak'));
    }
  });

  it('is right-continuous: the jump at a tie of three is 3/n and happens at the value', () => {
    const F = ecdf(data);
    expect(F.at(72) - F.at(71.999999)).toBeCloseTo(3 / 10, 12);
    expect(F.at(72)).toBe(0.7);
  });

  it('steps: one per distinct value, ascending, with F(x) as plain data', () => {
    expect(ecdf([2, 1, 2, 3]).steps).toEqual([
      { x: 1, p: 0.25 },
      { x: 2, p: 0.75 },
      { x: 3, p: 1 },
    ]);
    // Plain data: survives JSON (structured-clone safe).
    expect(JSON.parse(JSON.stringify(ecdf(data).steps))).toEqual(ecdf(data).steps);
  });

  it('ecdfAt on sorted data agrees with at()', () => {
    const sorted = [...data].sort((a, b) => a - b);
    expect(ecdfAt(sorted, 72)).toBe(ecdf(data).at(72));
  });

  it('is not defined for n = 0 (throws, naming the function) and rejects NaN', () => {
    expect(() => ecdf([])).toThrow('ecdf requires at least one data point');
    expect(() => ecdf([1, Number.NaN])).toThrow(/ecdf: value at index 1 is NaN/);
    expect(() => ecdf([1]).at(Number.NaN)).toThrow(/ecdfAt: t is NaN/);
  });
});

/**
 * Box plots: Tukey (1977) fences/whiskers/outliers and McGill, Tukey & Larsen (1978) notches
 * median ± 1.58·IQR/√n (REFERENCES.md "Box plots").
 */
import { describe, expect, it } from 'vitest';
import { boxPlot } from '../../../renderer/engine/stats';

describe('boxPlot', () => {
  const x = [47, 60, 62, 64, 65, 67, 69, 72, 73, 80];

  it('five numbers, fences and outliers of the 47…80 example (type 7)', () => {
    const b = boxPlot(x);
    if (!b.defined) throw new Error(b.reason);
    expect([b.value.min, b.value.q1, b.value.median, b.value.q3, b.value.max]).toEqual([47, 62.5, 66, 71.25, 80]);
    expect([b.value.lowerFence, b.value.upperFence]).toEqual([49.375, 84.375]);
    expect(b.value.outliers.map((o) => o.value)).toEqual([47]);
    expect(b.value.whiskerLow).toEqual({ defined: true, value: 60 });
    expect(b.value.quantileMethod).toContain('type 7');
  });

  it('notches at median ± 1.58·IQR/√n and width ∝ √n (McGill et al. 1978)', () => {
    const b = boxPlot(x);
    if (!b.defined) throw new Error(b.reason);
    const half = (1.58 * (71.25 - 62.5)) / Math.sqrt(10);
    expect(b.value.notchLow).toBeCloseTo(66 - half, 12);
    expect(b.value.notchHigh).toBeCloseTo(66 + half, 12);
    expect(b.value.relativeWidth).toBeCloseTo(Math.sqrt(10), 12);
  });

  it('type 6 changes the verdict: no outlier', () => {
    const b = boxPlot(x, { quantileType: 6 });
    if (!b.defined) throw new Error(b.reason);
    expect(b.value.outliers).toEqual([]);
  });

  it('not defined for n = 0', () => {
    expect(boxPlot([])).toEqual({ defined: false, reason: 'no values (n = 0)' });
  });
});

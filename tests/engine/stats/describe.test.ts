/**
 * describe(): small exact fixtures, CV, weighted mean, modes, Tukey fences, degenerate inputs.
 * Sources are named beside each check (REFERENCES.md sections "Small exact fixtures", "ECDF, CV",
 * "Box plots").
 */
import { describe as suite, expect, it } from 'vitest';
import type { Defined } from '../../../renderer/engine/defined';
import { coefficientOfVariation, describe, modes, weightedMean, type Summary } from '../../../renderer/engine/stats';

function value<T>(d: Defined<T>): T {
  if (!d.defined) throw new Error(`expected a defined value, got: ${d.reason}`);
  return d.value;
}

/** Walks a summary and collects every number that is NaN or infinite (there must be none). */
function badNumbers(x: unknown, path = 'summary'): string[] {
  if (typeof x === 'number') return Number.isFinite(x) ? [] : [path];
  if (Array.isArray(x)) return x.flatMap((v, i) => badNumbers(v, `${path}[${i}]`));
  if (x !== null && typeof x === 'object') {
    return Object.entries(x).flatMap(([k, v]) => badNumbers(v, `${path}.${k}`));
  }
  return [];
}

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.max(Math.abs(b), Number.MIN_VALUE);

suite('describe: small exact fixtures (REFERENCES.md, exact fractions [lib])', () => {
  const fixtures = [
    { data: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10], mean: 5.5, popVar: 8.25, sampleVar: 55 / 6, sampleSd: 3.0276503540974917 },
    { data: [6, 7, 15, 36, 39, 40, 41, 42, 43, 47, 49], mean: 365 / 11, popVar: 27716 / 121, sampleVar: 13858 / 55, sampleSd: 15.873362478178224 },
    { data: [47, 60, 62, 64, 65, 67, 69, 72, 73, 80], mean: 65.9, popVar: 70.89, sampleVar: 2363 / 30, sampleSd: 8.875058685251982 },
  ];
  for (const f of fixtures) {
    it(`n = ${f.data.length}, first ${f.data[0]}: mean, population and sample variance/SD`, () => {
      const s = describe(f.data);
      expect(s.n).toBe(f.data.length);
      expect(rel(value(s.mean), f.mean)).toBeLessThan(1e-15);
      expect(rel(value(s.populationVariance), f.popVar)).toBeLessThan(1e-14);
      expect(rel(value(s.sampleVariance), f.sampleVar)).toBeLessThan(1e-14);
      expect(rel(value(s.sampleSd), f.sampleSd)).toBeLessThan(1e-15);
      expect(rel(value(s.populationSd), Math.sqrt(f.popVar))).toBeLessThan(1e-15);
      expect(value(s.min)).toBe(Math.min(...f.data));
      expect(value(s.max)).toBe(Math.max(...f.data));
      expect(value(s.range)).toBe(Math.max(...f.data) - Math.min(...f.data));
    });
  }

  it('median is the usual middle value whatever the quantile type (x = 1…10 → 5.5)', () => {
    // Type 4 Q(0.5) = 5 on 1…10 (H&F table), but the median stays the textbook 5.5.
    expect(value(describe([1, 2, 3, 4, 5, 6, 7, 8, 9, 10], { quantileType: 4 }).median)).toBe(5.5);
    expect(value(describe([3, 1, 2]).median)).toBe(2);
  });

  it('quartiles follow the chosen type and the method is named (H&F table, x = 6 … 49)', () => {
    const data = [6, 7, 15, 36, 39, 40, 41, 42, 43, 47, 49];
    const s8 = describe(data, { quantileType: 8 });
    expect(value(s8.q1)).toBeCloseTo(18.5, 12);
    expect(value(s8.q3)).toBeCloseTo(257 / 6, 12);
    expect(s8.quantileType).toBe(8);
    expect(s8.quantileMethod).toContain('type 8');
    const s7 = describe(data);
    expect(s7.quantileType).toBe(7);
    expect(value(s7.iqr)).toBeCloseTo(42.5 - 25.5, 12);
  });
});

suite('weighted mean (REFERENCES.md: [80, 90, 70] → 81)', () => {
  it('weights [0.5, 0.3, 0.2] and [50, 30, 20] both give 81', () => {
    expect(value(weightedMean([80, 90, 70], [0.5, 0.3, 0.2]))).toBeCloseTo(81, 12);
    expect(value(weightedMean([80, 90, 70], [50, 30, 20]))).toBe(81);
    expect(value(describe([80, 90, 70], { weights: [50, 30, 20] }).weightedMean)).toBe(81);
  });

  it('is not defined without weights or when all weights are 0; rejects bad weights', () => {
    expect(describe([80, 90]).weightedMean).toEqual({ defined: false, reason: 'no weights given' });
    expect(weightedMean([80, 90], [0, 0])).toEqual({ defined: false, reason: 'every weight is 0' });
    expect(() => weightedMean([80, 90], [1])).toThrow(/weightedMean: 2 values but 1 weights/);
    expect(() => weightedMean([80, 90], [1, -1])).toThrow(/weightedMean: weight at index 1 is -1/);
    expect(() => weightedMean([80, 90], [1, Number.POSITIVE_INFINITY])).toThrow(/weightedMean: weight at index 1/);
  });
});

suite('coefficient of variation (REFERENCES.md "ECDF, CV")', () => {
  it('[0, 10, 20, 30, 40] °C → 79.06 %; the same temperatures in °F → 41.85 %', () => {
    const celsius = [0, 10, 20, 30, 40];
    const fahrenheit = celsius.map((c) => (c * 9) / 5 + 32);
    // s = √250, x̄ = 20 ⇒ CV = √250 / 20; °F: s = 1.8·√250, x̄ = 68.
    expect(value(coefficientOfVariation(celsius))).toBeCloseTo(Math.sqrt(250) / 20, 14);
    expect(value(coefficientOfVariation(celsius))).toBeCloseTo(0.7906, 4);
    expect(value(coefficientOfVariation(fahrenheit))).toBeCloseTo(0.4185, 4);
    expect(value(describe(celsius).cv)).toBe(value(coefficientOfVariation(celsius)));
  });

  it('is 0 (defined) when all values are equal and positive', () => {
    expect(coefficientOfVariation([70, 70, 70])).toEqual({ defined: true, value: 0 });
  });

  it('is not defined for a zero, near-zero or negative mean, or n < 2', () => {
    const zero = coefficientOfVariation([-1, 1]);
    expect(zero.defined).toBe(false);
    if (!zero.defined) expect(zero.reason).toMatch(/mean is 0/);
    // 0.1 + 0.2 − 0.3 ≠ 0 in binary64: the mean is rounding noise, not a real mean.
    const noise = coefficientOfVariation([0.1, 0.2, -0.3]);
    expect(noise.defined).toBe(false);
    const negative = coefficientOfVariation([-2, -1]);
    expect(negative.defined).toBe(false);
    if (!negative.defined) expect(negative.reason).toMatch(/negative/);
    const one = coefficientOfVariation([5]);
    expect(one.defined).toBe(false);
    if (!one.defined) expect(one.reason).toMatch(/n = 1/);
  });
});

suite('modes (rule: common practice, no source)', () => {
  it('all values sharing the greatest count, ascending', () => {
    expect(modes([90, 80, 80, 70, 90])).toEqual({ defined: true, value: [80, 90] });
    expect(modes([5, 5, 5, 1])).toEqual({ defined: true, value: [5] });
  });
  it('no mode when every value occurs once; not defined for n = 0', () => {
    expect(modes([1, 2, 3])).toEqual({ defined: false, reason: 'no mode: every value occurs once' });
    expect(modes([])).toEqual({ defined: false, reason: 'no values (n = 0)' });
  });
});

suite('Tukey fences, whiskers and outliers (Tukey 1977; REFERENCES.md "Box plots")', () => {
  const x = [47, 60, 62, 64, 65, 67, 69, 72, 73, 80];
  const labels = x.map((_, i) => `student ${i + 1}`);

  it('type 7: Q1 62.5, Q3 71.25, fences 49.375 / 84.375 — 47 is an outlier', () => {
    const s = describe(x, { labels });
    expect(value(s.q1)).toBe(62.5);
    expect(value(s.q3)).toBe(71.25);
    expect(value(s.lowerFence)).toBe(49.375);
    expect(value(s.upperFence)).toBe(84.375);
    expect(s.outliers).toEqual([{ index: 0, label: 'student 1', value: 47, side: 'low' }]);
    expect(value(s.whiskerLow)).toBe(60);
    expect(value(s.whiskerHigh)).toBe(80);
  });

  it('type 6: fences 45.375 / 88.375 — no outlier, whiskers at the data extremes', () => {
    const s = describe(x, { quantileType: 6, labels });
    expect(value(s.lowerFence)).toBe(45.375);
    expect(value(s.upperFence)).toBe(88.375);
    expect(s.outliers).toEqual([]);
    expect(value(s.whiskerLow)).toBe(47);
    expect(value(s.whiskerHigh)).toBe(80);
  });

  it('a point exactly ON a fence is not an outlier (strict comparison)', () => {
    // Hand arithmetic, type 7 with n = 5: Q1 = x₍₂₎ = 2, Q3 = x₍₄₎ = 4, IQR 2, fences −1 / 7.
    const onFence = describe([-1, 2, 3, 4, 7]);
    expect(value(onFence.lowerFence)).toBe(-1);
    expect(value(onFence.upperFence)).toBe(7);
    expect(onFence.outliers).toEqual([]);
    expect(value(onFence.whiskerLow)).toBe(-1);
    expect(value(onFence.whiskerHigh)).toBe(7);
    // Just beyond: same quartiles, now outliers; whiskers move to the most extreme data inside.
    const beyond = describe([-1.5, 2, 3, 4, 7.5]);
    expect(beyond.outliers.map((o) => [o.value, o.side])).toEqual([[-1.5, 'low'], [7.5, 'high']]);
    expect(value(beyond.whiskerLow)).toBe(2);
    expect(value(beyond.whiskerHigh)).toBe(4);
    expect(beyond.outliers[1]).toMatchObject({ index: 4, label: '#5' });
  });

  it('rejects labels of the wrong length', () => {
    expect(() => describe([1, 2], { labels: ['a'] })).toThrow(/describe: 2 values but 1 labels/);
  });
});

suite('degenerate inputs: not defined with a reason, never NaN', () => {
  const allReasons = (s: Summary): string[] =>
    Object.values(s).flatMap((v: unknown) =>
      v !== null && typeof v === 'object' && 'defined' in v && v.defined === false && 'reason' in v ? [String(v.reason)] : [],
    );

  it('n = 0: every statistic not defined, no outliers', () => {
    const s = describe([]);
    expect(s.n).toBe(0);
    expect(badNumbers(s)).toEqual([]);
    for (const key of ['mean', 'median', 'modes', 'min', 'max', 'range', 'sampleVariance', 'sampleSd', 'populationVariance', 'populationSd', 'cv', 'q1', 'q3', 'iqr', 'lowerFence', 'upperFence', 'whiskerLow', 'whiskerHigh'] as const) {
      expect(s[key].defined, key).toBe(false);
    }
    expect(allReasons(s).every((r) => r.length > 0)).toBe(true);
    expect(s.outliers).toEqual([]);
  });

  it('n = 1: sample variance/SD and CV not defined (n = 1); population variance 0; quartiles = the value', () => {
    const s = describe([73]);
    expect(badNumbers(s)).toEqual([]);
    expect(s.sampleVariance).toEqual({ defined: false, reason: 'sample variance needs at least 2 values (n = 1)' });
    expect(s.sampleSd.defined).toBe(false);
    expect(s.cv.defined).toBe(false);
    expect(s.populationVariance).toEqual({ defined: true, value: 0 });
    expect(value(s.mean)).toBe(73);
    expect(value(s.q1)).toBe(73);
    expect(value(s.q3)).toBe(73);
    expect(value(s.whiskerLow)).toBe(73);
    expect(s.modes).toEqual({ defined: false, reason: 'no mode: every value occurs once' });
  });

  it('all equal: SD 0, CV 0, one mode, zero range and IQR, no outliers', () => {
    const s = describe([64, 64, 64, 64]);
    expect(badNumbers(s)).toEqual([]);
    expect(value(s.sampleSd)).toBe(0);
    expect(value(s.cv)).toBe(0);
    expect(value(s.modes)).toEqual([64]);
    expect(value(s.range)).toBe(0);
    expect(value(s.iqr)).toBe(0);
    expect(s.outliers).toEqual([]);
  });

  it('mean 0: CV not defined with a reason', () => {
    const s = describe([-10, 0, 10]);
    expect(s.cv.defined).toBe(false);
    expect(badNumbers(s)).toEqual([]);
  });

  it('NaN or Infinity in the input throws, naming the function', () => {
    expect(() => describe([1, Number.NaN])).toThrow('describe: value at index 1 is NaN; only finite numbers are accepted');
    expect(() => describe([Number.NEGATIVE_INFINITY])).toThrow(/describe: value at index 0 is -Infinity/);
  });
});
